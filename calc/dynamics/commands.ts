/**
 * The `simulate` and `efficiency-map` commands: zod schemas of their JSON inputs, and the JSON
 * shape of their outputs (plain arrays, so the server can store and the client chart them).
 */
import { z } from 'zod';
import type { BldcLossModel, BldcSimulationParams } from '../contracts.js';
import { CalcInputError } from '../errors.js';
import { parseInput } from '../input.js';
import { efficiencyMap, type EfficiencyMap } from './efficiency-map.js';
import { DEFAULT_FLAT_TOP_ELECTRICAL_DEG } from './model.js';
import type { ProgressOptions, SteppedRun } from './progress.js';
import { runToEnd } from './progress.js';
import { startSimulation, type SimulationInput, type SimulationResult, type SimulationStats } from './simulate.js';
import { seriesToJson, type SeriesName, type SimulationSummary } from './summary.js';

const finite = z.number();

export const simulationParamsSchema = z.object({
  phaseResistanceOhm: finite,
  phaseInductanceH: finite,
  mutualInductanceH: finite,
  backEmfConstantVsPerRad: finite,
  flatTopElectricalDeg: finite.optional(),
  polePairs: finite,
  inertiaKgM2: finite,
  viscousFrictionNmsPerRad: finite,
  dcBusV: finite,
  backEmfShape: z.array(finite).optional(),
});

const loadSchema = z.object({
  kind: z.enum(['constant', 'quadratic', 'step']),
  torqueNm: finite,
  atSpeedRpm: finite.optional(),
  atTimeS: finite.optional(),
  inertiaKgM2: finite.optional(),
});

export const simulateInputSchema = z.object({
  params: simulationParamsSchema.optional(),
  design: z.looseObject({ simulationParams: simulationParamsSchema }).optional(),
  load: loadSchema,
  setSpeedRpm: finite.optional(),
  speedRampS: finite.optional(),
  currentLimitA: finite.optional(),
  currentControl: z.enum(['pi', 'hysteresis']).optional(),
  hysteresisBandA: finite.optional(),
  pwm: z.object({ mode: z.enum(['averaged', 'switched']), frequencyHz: finite.optional() }).optional(),
  controlPeriodS: finite.optional(),
  gains: z.object({ speedKp: finite.optional(), speedKi: finite.optional(), currentKp: finite.optional(), currentKi: finite.optional() }).optional(),
  supply: z
    .discriminatedUnion('kind', [
      z.object({ kind: z.literal('dc') }),
      z.object({ kind: z.literal('rectifier'), lineVoltageV: finite, frequencyHz: finite, capacitanceF: finite, sourceResistanceOhm: finite.optional() }),
    ])
    .optional(),
  durationS: finite,
  stepS: finite.optional(),
  outputPoints: finite.optional(),
  steadyWindowFraction: finite.optional(),
  initialAngleRad: finite.optional(),
});

type ParsedParams = z.infer<typeof simulationParamsSchema>;

function toParams(parsed: ParsedParams): BldcSimulationParams {
  const { backEmfShape, flatTopElectricalDeg, ...rest } = parsed;
  const params: BldcSimulationParams = { ...rest, flatTopElectricalDeg: flatTopElectricalDeg ?? DEFAULT_FLAT_TOP_ELECTRICAL_DEG };
  if (backEmfShape !== undefined) params.backEmfShape = backEmfShape;
  return params;
}

/** Drops the keys whose value is undefined (exactOptionalPropertyTypes). */
function defined<T extends object>(value: T): { [K in keyof T]: Exclude<T[K], undefined> } {
  return Object.fromEntries(Object.entries(value).filter(([, v]) => v !== undefined)) as { [K in keyof T]: Exclude<T[K], undefined> };
}

/**
 * Validates a `simulate` command input ({params} or {design: {simulationParams}}) and starts the run.
 * @param raw JSON input
 * @returns the stepped run (advance in chunks) — the worker uses this for progress and cancel
 */
export function startSimulationFromJson(raw: unknown): SteppedRun<SimulationResult> {
  const parsed = parseInput(simulateInputSchema, raw);
  const { params: rawParams, design, load, gains, pwm, supply, ...rest } = parsed;
  let params: BldcSimulationParams;
  let paramsField: string;
  if (rawParams !== undefined) {
    params = toParams(rawParams);
    paramsField = 'params';
  } else if (design !== undefined) {
    params = toParams(design.simulationParams);
    paramsField = 'design.simulationParams';
  } else {
    throw new CalcInputError('params', 'is required (or design with simulationParams)');
  }
  const input: SimulationInput = { ...defined(rest), params, load: defined(load) };
  if (gains !== undefined) input.gains = defined(gains);
  if (pwm !== undefined) input.pwm = defined(pwm);
  if (supply !== undefined) input.supply = supply.kind === 'dc' ? supply : defined(supply);
  return startSimulation(input, paramsField);
}

/** JSON output of `simulate`. */
export interface SimulateOutput {
  summary: SimulationSummary;
  /** Decimated series, equal length; names in SERIES_NAMES (timeS, speedRpm, torqueNm, ...). */
  series: Record<SeriesName, number[]>;
  stats: SimulationStats;
  assumptions: string[];
}

/** Converts a result to its JSON output. */
export function simulationResultToJson(result: SimulationResult): SimulateOutput {
  return { summary: result.summary, series: seriesToJson(result.series), stats: result.stats, assumptions: result.assumptions };
}

/**
 * `simulate`: validates, runs to the end, returns the JSON output.
 * @param raw JSON input @param options progress and cancel callbacks
 */
export function runSimulateCommand(raw: unknown, options: ProgressOptions = {}): SimulateOutput {
  return simulationResultToJson(runToEnd(startSimulationFromJson(raw), options));
}

const driveLossSchema = z.object({ fixedW: finite, perAmpereW: finite, perAmpereSquaredOhm: finite });
export const lossModelSchema = z.object({
  ratedSpeedRpm: finite,
  ratedTorqueNm: finite,
  maxSpeedRpm: finite,
  maxContinuousTorqueNm: finite,
  peakTorqueNm: finite,
  dcBusV: finite,
  polePairs: finite,
  phaseResistanceOhm: finite,
  torqueConstantNmPerA: finite,
  backEmfConstantVsPerRad: finite,
  ironHysteresisAtRatedW: finite,
  ironEddyAtRatedW: finite,
  magnetEddyAtRatedW: finite,
  frictionAtRatedW: finite,
  windageAtRatedW: finite,
  drive: driveLossSchema,
});

export const efficiencyMapInputSchema = z.object({
  lossModel: lossModelSchema.optional(),
  design: z.looseObject({ lossModel: lossModelSchema }).optional(),
  speedsRpm: z.array(finite),
  torquesNm: z.array(finite),
});

/** `efficiency-map`: {lossModel | design: {lossModel}, speedsRpm, torquesNm} → EfficiencyMap. */
export function runEfficiencyMapCommand(raw: unknown): EfficiencyMap {
  const parsed = parseInput(efficiencyMapInputSchema, raw);
  let model: BldcLossModel;
  let field: string;
  if (parsed.lossModel !== undefined) {
    model = parsed.lossModel;
    field = 'lossModel';
  } else if (parsed.design !== undefined) {
    model = parsed.design.lossModel;
    field = 'design.lossModel';
  } else {
    throw new CalcInputError('lossModel', 'is required (or design with lossModel)');
  }
  return efficiencyMap(model, parsed.speedsRpm, parsed.torquesNm, field);
}
