/**
 * Time-domain simulation of a star-connected BLDC on its six-step inverter: fixed-step RK4 on a
 * nominal grid, with every switching instant (Hall commutation, a freewheeling diode's current
 * reaching zero, a floating phase reaching a rail, a hysteresis threshold, a PWM edge, a load step)
 * located inside its step and stepped to exactly, so the solution keeps its fourth order across
 * the discontinuities of the inverter.
 *
 * References:
 * [1] P. Pillay, R. Krishnan, "Modeling, simulation, and analysis of permanent-magnet motor drives,
 *     Part II: The brushless DC motor drive", IEEE Trans. Industry Applications 25(2), 1989, 274–279.
 * [2] R. Krishnan, Electric Motor Drives: Modeling, Analysis, and Control, Prentice Hall, 2001, ch. 9.
 * [3] E. Hairer, S. P. Nørsett, G. Wanner, Solving Ordinary Differential Equations I, 1993, §II.6
 *     (discontinuities: integrate to the switching point, then restart).
 */
import type { BldcSimulationParams } from '../contracts.js';
import { CalcInputError, requireInRange, requireNonNegative, requirePositive } from '../errors.js';
import { PiController, defaultGains, rampedReference, type ControllerGains } from './controller.js';
import { locateEvent } from './integrator.js';
import {
  FIRST_BOUNDARY_RAD,
  LEG_DIODE_HIGH,
  LEG_DIODE_LOW,
  LEG_HIGH,
  LEG_LOW,
  LEG_OPEN,
  SECTOR_HIGH_LEG,
  SECTOR_LOW_LEG,
  SECTOR_RAD,
  hallSector,
  legFactor,
  offLegMode,
  sectorCount,
} from './inverter.js';
import { LOAD_CONSTANT, createLoadState, type LoadInput, type LoadState } from './load.js';
import {
  AUX_EMF,
  AUX_INPUT_POWER,
  AUX_LOAD_TORQUE,
  AUX_PHASE_V,
  AUX_SIZE,
  AUX_TERMINAL_V,
  AUX_TORQUE,
  BldcModel,
  DYNAMIC_STATE_SIZE,
  S_ANGLE,
  S_CURRENT_A,
  S_DC_BUS,
  S_ENERGY_COPPER,
  S_ENERGY_FRICTION,
  S_ENERGY_IN,
  S_ENERGY_LOAD,
  S_SPEED,
  STATE_SIZE,
  effectiveInductance,
  electricalTimeConstant,
  halfTransitionFromFlatTop,
  shapeTableFrom,
  validateSimulationParams,
} from './model.js';
import { runToEnd, type ProgressOptions, type SteppedRun } from './progress.js';
import { DEFAULT_STEADY_WINDOW_FRACTION, SummaryTracker, createSeries, type SimulationSeries, type SimulationSummary } from './summary.js';

/** Integration step when the caller gives none [s]. */
export const DEFAULT_STEP_S = 1e-6;
/** Largest step as a fraction of the electrical time constant (L − M)/R and of R_s·C [-] (accuracy of RK4; common practice). */
export const MAX_STEP_FRACTION_OF_TIME_CONSTANT = 0.1;
/** Most grid steps one run may take [-] (guard against a run that would not end in reasonable time). */
export const MAX_SIMULATION_STEPS = 50_000_000;
/** Points of the decimated output when the caller gives none [-]. */
export const DEFAULT_OUTPUT_POINTS = 2000;
/** Bounds on the output points [-] (memory stays bounded whatever the duration). */
export const MIN_OUTPUT_POINTS = 10;
export const MAX_OUTPUT_POINTS = 200_000;
/** Sampling period of the speed and current controllers [s] (a 20 kHz digital drive; common practice). */
export const DEFAULT_CONTROL_PERIOD_S = 50e-6;
/** PWM carrier frequency of the switched mode [Hz] (common practice for small drives). */
export const DEFAULT_PWM_FREQUENCY_HZ = 20_000;
/** Speed ramp time as a share of the run when the caller gives none [-] (common practice, no source). */
export const DEFAULT_RAMP_FRACTION_OF_DURATION = 0.25;
/** Hysteresis band as a share of the current limit [-] (common practice, no source). */
export const DEFAULT_HYSTERESIS_BAND_FRACTION = 0.05;
/** Series resistance of the supply and rectifier diodes when the caller gives none [Ω] (value from memory). */
export const DEFAULT_SOURCE_RESISTANCE_OHM = 0.05;
/** Switching events one grid step may contain before the run stops with an error [-] (guard). */
export const MAX_EVENTS_PER_STEP = 64;

const RPM_TO_RAD_S = (2 * Math.PI) / 60;

export type PwmMode = 'averaged' | 'switched';
export type CurrentControl = 'pi' | 'hysteresis';

/** DC-link supply: a stiff bus at params.dcBusV, or a six-pulse diode rectifier with a DC-link capacitor. */
export type SupplyInput =
  | { kind: 'dc' }
  | { kind: 'rectifier'; lineVoltageV: number; frequencyHz: number; capacitanceF: number; sourceResistanceOhm?: number };

/** Everything a run needs. Units in the names; see the README section for defaults. */
export interface SimulationInput {
  params: BldcSimulationParams;
  load: LoadInput;
  /** Set speed of the PI speed loop [rpm]; without it the drive applies the full bus (no speed loop). */
  setSpeedRpm?: number;
  /** Time of the speed reference ramp from 0 to set speed [s]; default DEFAULT_RAMP_FRACTION_OF_DURATION × durationS. */
  speedRampS?: number;
  /** Current limit on the peak phase current [A]; without it no limit. */
  currentLimitA?: number;
  /** How the current is held to its reference: sampled PI on the duty, or hysteresis on the upper switch. */
  currentControl?: CurrentControl;
  /** Width of the hysteresis band [A]; default DEFAULT_HYSTERESIS_BAND_FRACTION × currentLimitA. */
  hysteresisBandA?: number;
  /** PWM of the upper switch: averaged (the leg applies duty × V_dc) or switched at frequencyHz. */
  pwm?: { mode: PwmMode; frequencyHz?: number };
  controlPeriodS?: number;
  gains?: Partial<ControllerGains>;
  supply?: SupplyInput;
  durationS: number;
  stepS?: number;
  outputPoints?: number;
  /** Share of the run at its end used for ripple and efficiency [-]. */
  steadyWindowFraction?: number;
  /** Initial mechanical rotor angle [rad]; default 0 (phase a back-EMF rising zero crossing). */
  initialAngleRad?: number;
}

/** Counters of a run. */
export interface SimulationStats {
  steps: number;
  stepS: number;
  stateEvents: number;
  timeEvents: number;
  controlPeriodS: number;
  gains: ControllerGains;
}

export interface SimulationResult {
  summary: SimulationSummary;
  series: SimulationSeries;
  stats: SimulationStats;
  /** What was defaulted and assumed, for the report. */
  assumptions: string[];
}

/** The input with every default resolved and every rule checked. */
interface ResolvedInput {
  params: BldcSimulationParams;
  load: LoadState;
  stepAtTimeS: number | null;
  stepAtSpeedRadS: number | null;
  totalInertiaKgM2: number;
  setSpeedRadS: number | null;
  rampS: number;
  currentLimitA: number;
  hysteresis: boolean;
  bandA: number;
  switched: boolean;
  pwmPeriodS: number;
  controlEvery: number;
  controlPeriodS: number;
  gains: ControllerGains;
  rectifier: null | { peakLineV: number; angularFrequency: number; capacitanceF: number; sourceResistanceOhm: number };
  durationS: number;
  stepS: number;
  steps: number;
  recordEvery: number;
  capacity: number;
  windowStartS: number;
  initialAngleRad: number;
  assumptions: string[];
}

/**
 * Checks a simulation input and fills the defaults; throws CalcInputError naming the field.
 * @param input the run's input
 * @param paramsField name of the parameters in error messages ("params" or "design.simulationParams")
 */
export function resolveSimulationInput(input: SimulationInput, paramsField = 'params'): ResolvedInput {
  const params = input.params;
  validateSimulationParams(params, paramsField);
  const assumptions: string[] = [];
  requirePositive('durationS', input.durationS);
  const stepS = input.stepS ?? DEFAULT_STEP_S;
  if (input.stepS === undefined) assumptions.push(`step ${DEFAULT_STEP_S} s (DEFAULT_STEP_S)`);
  requirePositive('stepS', stepS);
  const timeConstant = electricalTimeConstant(params);
  const maxStep = MAX_STEP_FRACTION_OF_TIME_CONSTANT * timeConstant;
  if (stepS > maxStep) {
    throw new CalcInputError('stepS', `must be at most ${maxStep.toPrecision(3)} s, a tenth of the electrical time constant (L − M)/R = ${timeConstant.toPrecision(3)} s`);
  }
  const steps = Math.round(input.durationS / stepS);
  if (steps < 1) throw new CalcInputError('stepS', 'must not exceed durationS');
  if (steps > MAX_SIMULATION_STEPS) throw new CalcInputError('stepS', `gives ${steps} steps; at most ${MAX_SIMULATION_STEPS} are allowed (shorten durationS or lengthen stepS)`);

  const { state: load, stepAtTimeS, stepAtSpeedRadS } = createLoadState(input.load, input.setSpeedRpm);
  let stepTime = stepAtTimeS;
  if (input.load.kind === 'step' && stepTime === null && stepAtSpeedRadS === null) {
    stepTime = input.durationS / 2;
    assumptions.push('load step at half the run (no atTimeS or atSpeedRpm given)');
  }
  const totalInertiaKgM2 = params.inertiaKgM2 + (input.load.inertiaKgM2 ?? 0);

  let setSpeedRadS: number | null = null;
  let rampS = 0;
  if (input.setSpeedRpm !== undefined) {
    requirePositive('setSpeedRpm', input.setSpeedRpm);
    setSpeedRadS = input.setSpeedRpm * RPM_TO_RAD_S;
    rampS = input.speedRampS ?? DEFAULT_RAMP_FRACTION_OF_DURATION * input.durationS;
    if (input.speedRampS === undefined) assumptions.push(`speed ramp ${rampS} s (a quarter of the run)`);
    requireNonNegative('speedRampS', rampS);
  }
  let currentLimitA = Infinity;
  if (input.currentLimitA !== undefined) {
    requirePositive('currentLimitA', input.currentLimitA);
    currentLimitA = input.currentLimitA;
  }
  const hysteresis = input.currentControl === 'hysteresis';
  let bandA = 0;
  if (hysteresis) {
    if (!Number.isFinite(currentLimitA) && setSpeedRadS === null) {
      throw new CalcInputError('currentControl', 'hysteresis needs currentLimitA or setSpeedRpm');
    }
    bandA = input.hysteresisBandA ?? DEFAULT_HYSTERESIS_BAND_FRACTION * (Number.isFinite(currentLimitA) ? currentLimitA : 1);
    requirePositive('hysteresisBandA', bandA);
  }
  const switched = !hysteresis && input.pwm?.mode === 'switched';
  let pwmPeriodS = Infinity;
  if (switched) {
    const frequency = input.pwm?.frequencyHz ?? DEFAULT_PWM_FREQUENCY_HZ;
    requirePositive('pwm.frequencyHz', frequency);
    if (frequency * 2 * stepS > 1) throw new CalcInputError('pwm.frequencyHz', `must be at most 1/(2·stepS) = ${(1 / (2 * stepS)).toPrecision(3)} Hz`);
    pwmPeriodS = 1 / frequency;
  }
  const requestedControlPeriod = input.controlPeriodS ?? DEFAULT_CONTROL_PERIOD_S;
  requirePositive('controlPeriodS', requestedControlPeriod);
  const controlEvery = Math.max(1, Math.round(requestedControlPeriod / stepS));
  const controlPeriodS = controlEvery * stepS;

  let rectifier: ResolvedInput['rectifier'] = null;
  const supply = input.supply;
  if (supply !== undefined && supply.kind === 'rectifier') {
    requirePositive('supply.lineVoltageV', supply.lineVoltageV);
    requirePositive('supply.frequencyHz', supply.frequencyHz);
    requirePositive('supply.capacitanceF', supply.capacitanceF);
    const sourceResistanceOhm = supply.sourceResistanceOhm ?? DEFAULT_SOURCE_RESISTANCE_OHM;
    requirePositive('supply.sourceResistanceOhm', sourceResistanceOhm);
    const linkTimeConstant = sourceResistanceOhm * supply.capacitanceF;
    if (stepS > MAX_STEP_FRACTION_OF_TIME_CONSTANT * linkTimeConstant) {
      throw new CalcInputError('stepS', `must be at most ${(MAX_STEP_FRACTION_OF_TIME_CONSTANT * linkTimeConstant).toPrecision(3)} s, a tenth of the DC-link time constant R_s·C`);
    }
    rectifier = { peakLineV: Math.SQRT2 * supply.lineVoltageV, angularFrequency: 2 * Math.PI * supply.frequencyHz, capacitanceF: supply.capacitanceF, sourceResistanceOhm };
    if (supply.sourceResistanceOhm === undefined) assumptions.push(`supply resistance ${DEFAULT_SOURCE_RESISTANCE_OHM} Ω`);
    assumptions.push('DC link pre-charged to the peak line-to-line voltage');
  }

  const inductance = effectiveInductance(params.phaseInductanceH, params.mutualInductanceH);
  const nominalBus = rectifier === null ? params.dcBusV : rectifier.peakLineV;
  const gains = { ...defaultGains(params.phaseResistanceOhm, inductance, params.backEmfConstantVsPerRad, totalInertiaKgM2, nominalBus, controlPeriodS), ...input.gains };
  for (const [name, value] of Object.entries(gains)) requireNonNegative(`gains.${name}`, value);
  if (input.gains === undefined && (setSpeedRadS !== null || Number.isFinite(currentLimitA))) {
    assumptions.push('controller gains from the equivalent DC motor (pole–zero cancellation, symmetric optimum)');
  }

  const outputPoints = input.outputPoints ?? DEFAULT_OUTPUT_POINTS;
  if (!Number.isInteger(outputPoints)) throw new CalcInputError('outputPoints', 'must be an integer');
  requireInRange('outputPoints', outputPoints, MIN_OUTPUT_POINTS, MAX_OUTPUT_POINTS);
  const recordEvery = Math.max(1, Math.ceil(steps / (outputPoints - 1)));
  const capacity = Math.floor(steps / recordEvery) + 2;
  const windowFraction = input.steadyWindowFraction ?? DEFAULT_STEADY_WINDOW_FRACTION;
  requireInRange('steadyWindowFraction', windowFraction, 0.001, 1);
  const initialAngleRad = input.initialAngleRad ?? 0;
  if (!Number.isFinite(initialAngleRad)) throw new CalcInputError('initialAngleRad', 'must be a finite number');
  if (params.backEmfShape === undefined && params.flatTopElectricalDeg !== 120) {
    assumptions.push('trapezoid corners that do not fall on commutations are stepped over (local order loss)');
  }

  return {
    params,
    load,
    stepAtTimeS: stepTime,
    stepAtSpeedRadS,
    totalInertiaKgM2,
    setSpeedRadS,
    rampS,
    currentLimitA,
    hysteresis,
    bandA,
    switched,
    pwmPeriodS,
    controlEvery,
    controlPeriodS,
    gains,
    rectifier,
    durationS: steps * stepS,
    stepS,
    steps,
    recordEvery,
    capacity,
    windowStartS: steps * stepS * (1 - windowFraction),
    initialAngleRad,
    assumptions,
  };
}

/** Relative overshoot of a floating phase beyond a rail that clamps it to its diode [-] (numerical tolerance). */
const RAIL_TOLERANCE = 1e-9;

/*
 * Indices as const enums, so that esbuild writes the numbers into the stepping loop: V8 re-reads a
 * module-level or imported constant with a check on every use, which the inner loop pays millions
 * of times. They mirror the exports of model.ts, inverter.ts and load.ts (checked below).
 */
const enum State {
  CurrentA = 0,
  Speed = 3,
  Angle = 4,
  DcBus = 5,
  EnergyIn = 6,
  EnergyCopper = 7,
  EnergyLoad = 8,
  EnergyFriction = 9,
  Size = 10,
}
const enum Aux {
  Torque = 1,
  LoadTorque = 2,
  InputPower = 3,
  Emf = 4,
  PhaseV = 7,
  TerminalV = 10,
  Size = 14,
}
const enum Leg {
  High = 0,
  Low = 1,
  DiodeLow = 2,
  DiodeHigh = 3,
  Open = 4,
}
const enum LoadKindIndex {
  Constant = 0,
}
/** Event indices: one per leg (diode current zero / floating phase at a rail), then the others. */
const enum Event {
  Hall = 3,
  Hysteresis = 4,
  Standstill = 5,
  LoadStep = 6,
  Count = 7,
}
const mirrors: [number, number][] = [
  [State.CurrentA, S_CURRENT_A], [State.Speed, S_SPEED], [State.Angle, S_ANGLE], [State.DcBus, S_DC_BUS],
  [State.EnergyIn, S_ENERGY_IN], [State.EnergyCopper, S_ENERGY_COPPER], [State.EnergyLoad, S_ENERGY_LOAD],
  [State.EnergyFriction, S_ENERGY_FRICTION], [State.Size, STATE_SIZE], [Aux.Torque, AUX_TORQUE],
  [Aux.LoadTorque, AUX_LOAD_TORQUE], [Aux.InputPower, AUX_INPUT_POWER], [Aux.Emf, AUX_EMF], [Aux.PhaseV, AUX_PHASE_V],
  [Aux.TerminalV, AUX_TERMINAL_V], [Aux.Size, AUX_SIZE], [Leg.High, LEG_HIGH], [Leg.Low, LEG_LOW],
  [Leg.DiodeLow, LEG_DIODE_LOW], [Leg.DiodeHigh, LEG_DIODE_HIGH], [Leg.Open, LEG_OPEN], [LoadKindIndex.Constant, LOAD_CONSTANT],
  [6, DYNAMIC_STATE_SIZE],
];
if (mirrors.some(([local, exported]) => local !== exported)) throw new Error('simulate.ts index enums no longer match model.ts, inverter.ts or load.ts');


/** Fewest quiet steps worth loading the model's fields for (their hand-back costs one evaluation) [-]. */
const MIN_QUIET_STEPS = 4;

/**
 * Event value of one leg (see eventValues): the current of a freewheeling diode, the distance of a
 * floating terminal from the nearer rail, or ∞ for a switched leg.
 */
function legEventValue(mode: number, current: number, openTerminalV: number, vdc: number): number {
  if (mode === Leg.DiodeLow) return current;
  if (mode === Leg.DiodeHigh) return -current;
  if (mode === Leg.Open) {
    const toHigh = vdc - openTerminalV;
    return toHigh < openTerminalV ? toHigh : openTerminalV;
  }
  return Infinity;
}

/** The stepping engine. Construct with a resolved input; advance in chunks; read the result. */
class BldcSimulation implements SteppedRun<SimulationResult> {
  private readonly model: BldcModel;
  private auxStart = new Float64Array(Aux.Size);
  private auxEnd = new Float64Array(Aux.Size);
  private x = new Float64Array(State.Size);
  private xTrial = new Float64Array(State.Size);
  private k1 = new Float64Array(State.Size);
  private kNext = new Float64Array(State.Size);
  private readonly legMode = new Int32Array(3);
  private readonly legFactor = new Float64Array(3);
  private readonly closed = new Float64Array(3);
  private g0 = new Float64Array(Event.Count);
  private g1 = new Float64Array(Event.Count);
  /** Per leg: 1 while a diode that just blocked at zero current must not be re-clamped at this same instant. */
  private readonly railHold = new Uint8Array(3);
  private railHoldAny = false;
  private readonly due = new Uint8Array(Event.Count);
  private readonly gAt: (tau: number) => number;
  private readonly speedPi: PiController;
  private readonly currentPi: PiController;
  private readonly tracker: SummaryTracker;
  private readonly series: SimulationSeries;

  private t = 0;
  /** Length of the trial step being taken [s]. */
  private tau = 0;
  private n = 0;
  /** Grid steps left until the next recorded point and the next controller sample (counters, not n % m). */
  private untilRecord: number;
  private untilControl: number;
  private k1Valid = false;
  private highLeg = 0;
  private lowLeg = 0;
  private sectorIndex = 0;
  private thetaPrev = 0;
  private thetaNext = 0;
  private duty = 1;
  private currentRef = Infinity;
  private hysteresisOn = true;
  private pwmOn = true;
  private pwmNextEdge = Infinity;
  private pwmNextIsStart = true;
  private pwmIndex = 0;
  private stepPendingTime: number;
  private stepPendingSpeed: number;
  private refineEvent = 0;
  /** Least of the event values eventValues last wrote [mixed units]; NaN values are left out. */
  private leastEventValue = Infinity;
  private stateEvents = 0;
  private timeEvents = 0;
  private readonly tolerance: number;
  /** What quietSteps hands to the tracker, which reads vectors (S_ and AUX_ indices). */
  private readonly quietX = new Float64Array(State.Size);
  private readonly quietAux = new Float64Array(Aux.Size);

  constructor(private readonly input: ResolvedInput) {
    const params = input.params;
    this.model = new BldcModel({
      phaseResistanceOhm: params.phaseResistanceOhm,
      effectiveInductanceH: effectiveInductance(params.phaseInductanceH, params.mutualInductanceH),
      backEmfConstantVsPerRad: params.backEmfConstantVsPerRad,
      polePairs: params.polePairs,
      totalInertiaKgM2: input.totalInertiaKgM2,
      viscousFrictionNmsPerRad: params.viscousFrictionNmsPerRad,
      halfTransition: halfTransitionFromFlatTop(params.flatTopElectricalDeg),
      shapeTable: params.backEmfShape === undefined ? null : shapeTableFrom(params.backEmfShape),
      legFactor: this.legFactor,
      closed: this.closed,
      load: input.load,
      rectifier: input.rectifier,
      aux: this.auxStart,
    });
    this.gAt = (tau: number): number => {
      this.tau = tau;
      return this.trial(this.refineEvent);
    };
    this.speedPi = new PiController(input.gains.speedKp, input.gains.speedKi, input.controlPeriodS, 0, input.currentLimitA);
    this.currentPi = new PiController(input.gains.currentKp, input.gains.currentKi, input.controlPeriodS, 0, 1);
    this.tracker = new SummaryTracker(input.windowStartS, input.setSpeedRadS ?? Number.NaN);
    this.series = createSeries(input.capacity);
    this.tolerance = 1e-9 * input.stepS;
    this.untilRecord = input.recordEvery;
    this.untilControl = input.controlEvery;
    this.stepPendingTime = input.stepAtTimeS ?? Infinity;
    this.stepPendingSpeed = input.stepAtSpeedRadS ?? Infinity;

    this.x[State.DcBus] = input.rectifier === null ? params.dcBusV : input.rectifier.peakLineV;
    this.x[State.Angle] = input.initialAngleRad;
    const electrical = params.polePairs * input.initialAngleRad;
    this.sectorIndex = hallSector(electrical);
    const count = sectorCount(electrical);
    this.thetaPrev = (FIRST_BOUNDARY_RAD + SECTOR_RAD * count) / params.polePairs;
    this.thetaNext = (FIRST_BOUNDARY_RAD + SECTOR_RAD * (count + 1)) / params.polePairs;
    this.highLeg = SECTOR_HIGH_LEG[this.sectorIndex] as number;
    this.lowLeg = SECTOR_LOW_LEG[this.sectorIndex] as number;
    this.legMode.fill(Leg.Open);
    this.refreshLegs();
    this.control();
    if (input.switched) {
      this.pwmNextEdge = 0;
      this.pwmNextIsStart = true;
      this.handleTimeEvents();
    }
    this.record();
  }

  get done(): boolean {
    return this.n >= this.input.steps;
  }

  advance(maxSteps: number): number {
    const last = Math.min(this.input.steps, this.n + maxSteps);
    while (this.n < last) {
      this.quietSteps(last);
      if (this.n < last) this.gridStep();
    }
    return this.n / this.input.steps;
  }

  result(): SimulationResult {
    if (!this.done) throw new Error('the simulation has not finished');
    const x = this.x;
    this.ensureStart();
    const params = this.input.params;
    const inductance = effectiveInductance(params.phaseInductanceH, params.mutualInductanceH);
    const ia = x[State.CurrentA] as number;
    const ib = x[State.CurrentA + 1] as number;
    const ic = x[State.CurrentA + 2] as number;
    const speed = x[State.Speed] as number;
    const energies = {
      inputJ: x[State.EnergyIn] as number,
      copperLossJ: x[State.EnergyCopper] as number,
      loadJ: x[State.EnergyLoad] as number,
      frictionJ: x[State.EnergyFriction] as number,
      kineticJ: 0.5 * this.input.totalInertiaKgM2 * speed * speed,
      magneticJ: 0.5 * inductance * (ia * ia + ib * ib + ic * ic),
    };
    return {
      summary: this.tracker.finish(speed, energies, energies.inputJ, energies.loadJ, this.series),
      series: this.series,
      stats: {
        steps: this.input.steps,
        stepS: this.input.stepS,
        stateEvents: this.stateEvents,
        timeEvents: this.timeEvents,
        controlPeriodS: this.input.controlPeriodS,
        gains: this.input.gains,
      },
      assumptions: this.input.assumptions,
    };
  }

  /**
   * Takes grid steps in the model's fields while nothing happens: no event crossed, no time event,
   * no controller sample and no recorded point due, with at most one leg floating. Each step is the
   * one gridStep would take (the same RK4 arithmetic, bit for bit); it stops before any step in
   * which an event value reaches zero or the state stops being finite, and leaves that step and the
   * bookkeeping steps to gridStep. Why: per step, gridStep writes the derivative, the auxiliary
   * outputs and every event value into vectors and swaps them, which cost about a third of a run.
   * @param last grid step index to stop at [-]
   */
  private quietSteps(last: number): void {
    const input = this.input;
    if (!this.k1Valid || this.railHoldAny) return;
    const room = Math.min(last - this.n, this.untilRecord - 1, this.untilControl - 1, input.steps - 1 - this.n);
    if (room < MIN_QUIET_STEPS) return;
    const model = this.model;
    const modes = this.legMode;
    let openLegs = 0;
    for (let k = 0; k < 3; k++) if (modes[k] === Leg.Open) openLegs += 1;
    if (openLegs > 1) return;
    model.startFrom(this.x, this.k1);
    const modeA = modes[0] as number;
    const modeB = modes[1] as number;
    const modeC = modes[2] as number;
    const stepS = input.stepS;
    const tolerance = this.tolerance;
    const standstillArmed = input.load.kind === LoadKindIndex.Constant && input.load.active === 1;
    const hysteresis = input.hysteresis && Number.isFinite(this.currentRef);
    const halfBand = 0.5 * input.bandA;
    const tracker = this.tracker;
    const sampleX = this.quietX;
    const sampleAux = this.quietAux;
    let taken = 0;
    while (taken < room) {
      const tEnd = (this.n + 1) * stepS;
      if (!(this.pwmNextEdge >= tEnd - tolerance && this.stepPendingTime >= tEnd - tolerance)) break;
      model.time = this.t;
      model.stepS = tEnd - this.t;
      model.stepAhead(false);
      const ia = model.endA;
      const ib = model.endB;
      const ic = model.endC;
      const speed = model.endSpeed;
      const vdc = model.endVdc;
      // Leave a non-finite state to gridStep, which reports it.
      if (!(ia - ia === 0 && ib - ib === 0 && ic - ic === 0 && speed - speed === 0 && vdc - vdc === 0)) break;
      // The event values of eventValues at the end of the step; the step counts only if all stay positive.
      let least = legEventValue(modeA, ia, model.openTerminalV, vdc);
      const valueB = legEventValue(modeB, ib, model.openTerminalV, vdc);
      if (valueB < least) least = valueB;
      const valueC = legEventValue(modeC, ic, model.openTerminalV, vdc);
      if (valueC < least) least = valueC;
      const theta = model.endAngle;
      const fromPrev = theta - this.thetaPrev;
      if (fromPrev < least) least = fromPrev;
      const toNext = this.thetaNext - theta;
      if (toNext < least) least = toNext;
      if (hysteresis) {
        const absA = ia < 0 ? -ia : ia;
        const absB = ib < 0 ? -ib : ib;
        const absC = ic < 0 ? -ic : ic;
        const measured = absA > absB ? (absA > absC ? absA : absC) : absB > absC ? absB : absC;
        const band = this.hysteresisOn ? this.currentRef + halfBand - measured : measured - (this.currentRef - halfBand);
        if (band < least) least = band;
      }
      if (standstillArmed && speed < least) least = speed;
      const loadStep = this.stepPendingSpeed - speed;
      if (loadStep < least) least = loadStep;
      if (!(least > 0)) break;
      model.acceptStep();
      this.t = tEnd;
      this.n += 1;
      taken += 1;
      sampleX[State.CurrentA] = ia;
      sampleX[State.CurrentA + 1] = ib;
      sampleX[State.CurrentA + 2] = ic;
      sampleX[State.Speed] = speed;
      sampleX[State.EnergyIn] = model.endIn;
      sampleX[State.EnergyLoad] = model.endLoad;
      sampleAux[Aux.Torque] = model.torque;
      tracker.time = tEnd;
      tracker.sample(sampleX, sampleAux);
    }
    if (taken === 0) return;
    model.writeStart(this.x);
    // Leave what a committed gridStep leaves (k1, auxiliary outputs, event values valid), so the next
    // gridStep takes its plain path and has its whole guard of events, as it would have had. The
    // evaluation gives kNext's bits: the same derive() at the same state and time.
    this.k1Valid = false;
    this.ensureStart();
    this.untilRecord -= taken;
    this.untilControl -= taken;
  }

  /** One step of the nominal grid, cut at every time event and state event inside it. */
  private gridStep(): void {
    const tEnd = (this.n + 1) * this.input.stepS;
    const tolerance = this.tolerance;
    // Common case first: no time event inside, start values valid, and no state event crossed in the
    // trial step. It does exactly what the general loop below would do in that case.
    let plain = this.k1Valid && !this.railHoldAny && this.pwmNextEdge >= tEnd - tolerance && this.stepPendingTime >= tEnd - tolerance;
    if (plain) {
      const h = tEnd - this.t;
      this.tau = h;
      this.trial(-1);
      // Every crossing ends at a value ≤ 0 (see crossed), so a positive least value means none.
      if (!(this.leastEventValue > 0)) {
        for (let j = 0; j < Event.Count; j++) {
          if (this.crossed(j)) {
            plain = false;
            break;
          }
        }
      }
      if (plain) this.commit(h);
      else this.substep(h, true);
    }
    for (let guard = 0; !plain; guard++) {
      if (guard > MAX_EVENTS_PER_STEP) {
        throw new CalcInputError('stepS', `is too large: more than ${MAX_EVENTS_PER_STEP} switching events within one step near t = ${this.t.toPrecision(6)} s`);
      }
      if (tEnd - this.t <= tolerance) break;
      const timeEvent = this.nextTimeEvent();
      if (timeEvent - this.t <= tolerance) {
        this.handleTimeEvents();
        continue;
      }
      const target = timeEvent < tEnd - tolerance ? timeEvent : tEnd;
      this.substep(target - this.t, false);
      if (Math.abs(target - this.t) <= tolerance) this.t = target;
    }
    this.t = tEnd;
    this.n += 1;
    const x = this.x;
    const speed = x[State.Speed] as number;
    if (!Number.isFinite(speed) || !Number.isFinite(x[State.CurrentA] as number) || !Number.isFinite(x[State.DcBus] as number)) {
      throw new CalcInputError('stepS', `gives a non-finite state at t = ${this.t.toPrecision(6)} s: the step is too large for this system`);
    }
    this.ensureStart();
    this.tracker.time = this.t;
    this.tracker.sample(x, this.auxStart);
    if (--this.untilRecord === 0 || this.n === this.input.steps) {
      if (this.untilRecord === 0) this.untilRecord = this.input.recordEvery;
      this.record();
    }
    if (--this.untilControl === 0) {
      this.untilControl = this.input.controlEvery;
      this.control();
    }
  }

  /**
   * Advances by at most `h`, stopping at the first state event inside (which it then handles).
   * @param h step [s]
   * @param tried true when trial(h, −1) has just been taken from the valid committed start
   */
  private substep(h: number, tried: boolean): void {
    if (!tried) this.ensureStart();
    let stepLength = h;
    let refined = -1;
    for (let guard = 0; guard < MAX_EVENTS_PER_STEP; guard++) {
      if (guard > 0 || !tried) {
        this.tau = stepLength;
        this.trial(-1);
      }
      let earliest = -1;
      let earliestTau = Infinity;
      for (let j = 0; j < Event.Count; j++) {
        if (!this.crossed(j)) continue;
        const a = this.g0[j] as number;
        // The event just located lies at the end of this step by construction (locateEvent closed its
        // bracket there). Its chord estimate can fall short, by more than the 1e-6 share below, when g
        // jumps there (a floating terminal when a square back-EMF reverses) or when the step is a short
        // substep (an event just after a PWM edge, where the tolerance is a large share of the step):
        // the search would then locate the same end again until the guard stops the run.
        const tau = j === refined ? stepLength : a > 0 ? (stepLength * a) / (a - (this.g1[j] as number)) : 0;
        if (tau < earliestTau) {
          earliestTau = tau;
          earliest = j;
        }
      }
      if (earliest < 0) {
        this.commit(stepLength);
        return;
      }
      if (earliestTau === 0) {
        // An event due at the very start (a diode entered with zero current, a boundary sitting on θ).
        for (let j = 0; j < Event.Count; j++) this.due[j] = (this.g0[j] as number) === 0 && this.crossed(j) ? 1 : 0;
        this.handleEvents(true);
        return;
      }
      if (refined >= 0 && earliestTau >= stepLength * (1 - 1e-6)) {
        for (let j = 0; j < Event.Count; j++) this.due[j] = this.crossed(j) ? 1 : 0;
        this.commit(stepLength);
        this.handleEvents(false);
        return;
      }
      this.refineEvent = earliest;
      stepLength = locateEvent(this.gAt, 0, this.g0[earliest] as number, stepLength, this.g1[earliest] as number, this.tolerance);
      refined = earliest;
    }
    throw new CalcInputError('stepS', `is too large: switching events could not be separated near t = ${this.t.toPrecision(6)} s`);
  }

  /** Steps from the committed state by the field `tau` into xTrial; returns event `j`'s value there (or 0). */
  private trial(j: number): number {
    this.rk4();
    if (j >= 0) return this.eventValue(j, this.xTrial, this.auxEnd);
    this.eventValues(this.xTrial, this.auxEnd, this.g1);
    return 0;
  }

  /**
   * Classical RK4 from the committed (t, x, k1) over `tau` into xTrial, then kNext = f(t + τ, xTrial)
   * with the auxiliary outputs into auxEnd (BldcModel.rk4Step; the same arithmetic as rk4Step of
   * integrator.ts). Time and step go through the model's fields, not arguments, which V8 would box.
   */
  private rk4(): void {
    const model = this.model;
    model.time = this.t;
    model.stepS = this.tau;
    model.rk4Step(this.x, this.k1, this.xTrial, this.kNext, this.auxEnd);
  }

  private crossed(j: number): boolean {
    const a = this.g0[j] as number;
    const b = this.g1[j] as number;
    if (a > 0) return b <= 0;
    return a === 0 && b < 0 && j !== Event.Standstill && j !== Event.LoadStep;
  }

  private commit(h: number): void {
    let swap = this.x;
    this.x = this.xTrial;
    this.xTrial = swap;
    swap = this.k1;
    this.k1 = this.kNext;
    this.kNext = swap;
    swap = this.auxStart;
    this.auxStart = this.auxEnd;
    this.auxEnd = swap;
    swap = this.g0;
    this.g0 = this.g1;
    this.g1 = swap;
    this.t += h;
    this.k1Valid = true;
    if (this.railHoldAny && h > 0) {
      this.railHold.fill(0);
      this.railHoldAny = false;
    }
  }

  /**
   * Makes k1, auxStart and the event values g0 match the committed state; snaps a floating phase
   * that would exceed a rail to its diode (unless that diode has just blocked at this instant).
   */
  private ensureStart(): void {
    if (this.k1Valid) return;
    for (let pass = 0; pass < 4 && !this.k1Valid; pass++) {
      this.model.time = this.t;
      this.model.evaluate(this.x, this.k1, this.auxStart);
      this.k1Valid = true;
      const vdc = this.x[State.DcBus] as number;
      for (let k = 0; k < 3; k++) {
        if (this.legMode[k] !== Leg.Open || this.railHold[k] === 1) continue;
        const terminal = this.auxStart[Aux.TerminalV + k] as number;
        if (terminal > vdc * (1 + RAIL_TOLERANCE)) this.setLegMode(k, Leg.DiodeHigh);
        else if (terminal < -vdc * RAIL_TOLERANCE) this.setLegMode(k, Leg.DiodeLow);
      }
    }
    this.eventValues(this.x, this.auxStart, this.g0);
  }

  private setLegMode(k: number, mode: number): void {
    this.legMode[k] = mode;
    this.legFactor[k] = legFactor(mode, this.highFactor());
    this.closed[k] = mode === Leg.Open ? 0 : 1;
    this.k1Valid = false;
  }

  private highFactor(): number {
    return this.input.hysteresis || this.input.switched ? 1 : this.duty;
  }

  private gateOn(): boolean {
    if (this.input.hysteresis) return this.hysteresisOn;
    if (this.input.switched) return this.pwmOn;
    return true;
  }

  /** Sets each leg from the sector and the gate: commanded legs switch, released legs freewheel or float. */
  private refreshLegs(): void {
    const gate = this.gateOn();
    for (let k = 0; k < 3; k++) {
      let mode: number;
      if (k === this.highLeg && gate) mode = Leg.High;
      else if (k === this.lowLeg) mode = Leg.Low;
      else {
        const previous = this.legMode[k] as number;
        mode = previous === Leg.High || previous === Leg.Low ? offLegMode(this.x[State.CurrentA + k] as number) : previous;
      }
      this.setLegMode(k, mode);
    }
  }

  private maxCurrent(x: Float64Array): number {
    return Math.max(Math.abs(x[State.CurrentA] as number), Math.abs(x[State.CurrentA + 1] as number), Math.abs(x[State.CurrentA + 2] as number));
  }

  /** Value of event function j; positive while nothing happens, crossing zero at the event (∞ when disarmed). */
  private eventValue(j: number, x: Float64Array, aux: Float64Array): number {
    if (j < 3) {
      const mode = this.legMode[j];
      const current = x[State.CurrentA + j] as number;
      if (mode === Leg.DiodeLow) return current;
      if (mode === Leg.DiodeHigh) return -current;
      if (mode === Leg.Open) {
        const terminal = aux[Aux.TerminalV + j] as number;
        return Math.min((x[State.DcBus] as number) - terminal, terminal);
      }
      return Infinity;
    }
    if (j === Event.Hall) {
      const theta = x[State.Angle] as number;
      return Math.min(theta - this.thetaPrev, this.thetaNext - theta);
    }
    if (j === Event.Hysteresis) {
      if (!this.input.hysteresis || !Number.isFinite(this.currentRef)) return Infinity;
      const measured = this.maxCurrent(x);
      const half = 0.5 * this.input.bandA;
      return this.hysteresisOn ? this.currentRef + half - measured : measured - (this.currentRef - half);
    }
    if (j === Event.Standstill) {
      return this.input.load.kind === LoadKindIndex.Constant && this.input.load.active === 1 ? (x[State.Speed] as number) : Infinity;
    }
    return this.stepPendingSpeed - (x[State.Speed] as number);
  }

  /**
   * All event values at once into `out` (the same values as eventValue, written out without calls:
   * a double returned from a call V8 does not inline is boxed, and this runs every step).
   */
  private eventValues(x: Float64Array, aux: Float64Array, out: Float64Array): void {
    const vdc = x[State.DcBus] as number;
    let least = Infinity;
    for (let k = 0; k < 3; k++) {
      const mode = this.legMode[k];
      let value = Infinity;
      if (mode === Leg.DiodeLow) value = x[State.CurrentA + k] as number;
      else if (mode === Leg.DiodeHigh) value = -(x[State.CurrentA + k] as number);
      else if (mode === Leg.Open) {
        const terminal = aux[Aux.TerminalV + k] as number;
        const toHigh = vdc - terminal;
        value = toHigh < terminal ? toHigh : terminal;
      }
      out[k] = value;
      if (value < least) least = value;
    }
    const theta = x[State.Angle] as number;
    const fromPrev = theta - this.thetaPrev;
    const toNext = this.thetaNext - theta;
    const hall = fromPrev < toNext ? fromPrev : toNext;
    out[Event.Hall] = hall;
    if (hall < least) least = hall;
    if (!this.input.hysteresis || !Number.isFinite(this.currentRef)) out[Event.Hysteresis] = Infinity;
    else {
      const ia = Math.abs(x[State.CurrentA] as number);
      const ib = Math.abs(x[State.CurrentA + 1] as number);
      const ic = Math.abs(x[State.CurrentA + 2] as number);
      const measured = ia > ib ? (ia > ic ? ia : ic) : ib > ic ? ib : ic;
      const half = 0.5 * this.input.bandA;
      const band = this.hysteresisOn ? this.currentRef + half - measured : measured - (this.currentRef - half);
      out[Event.Hysteresis] = band;
      if (band < least) least = band;
    }
    const speed = x[State.Speed] as number;
    const standstill = this.input.load.kind === LoadKindIndex.Constant && this.input.load.active === 1 ? speed : Infinity;
    out[Event.Standstill] = standstill;
    if (standstill < least) least = standstill;
    const loadStep = this.stepPendingSpeed - speed;
    out[Event.LoadStep] = loadStep;
    if (loadStep < least) least = loadStep;
    this.leastEventValue = least;
  }


  /** Applies every event marked in `due` (crossed in the last committed step, or due now when atStart). */
  private handleEvents(atStart: boolean): void {
    const x = this.x;
    for (let j = 0; j < Event.Count; j++) {
      if (this.due[j] === 0) continue;
      this.stateEvents += 1;
      if (j < 3) {
        const mode = this.legMode[j];
        if (mode === Leg.Open) {
          // A floating phase reached a rail: its diode starts to conduct.
          const terminal = this.auxStart[Aux.TerminalV + j] as number;
          this.setLegMode(j, terminal > 0.5 * (x[State.DcBus] as number) ? Leg.DiodeHigh : Leg.DiodeLow);
        } else {
          // The freewheeling current reached zero: the diode blocks and the phase floats ([1] Table I).
          if (atStart) {
            this.railHold[j] = 1;
            this.railHoldAny = true;
          }
          const residual = x[State.CurrentA + j] as number;
          x[State.CurrentA + j] = 0;
          const other1 = (j + 1) % 3;
          const other2 = (j + 2) % 3;
          const share = 0.5 * residual;
          x[State.CurrentA + other1] = (x[State.CurrentA + other1] as number) + share;
          x[State.CurrentA + other2] = (x[State.CurrentA + other2] as number) + share;
          this.setLegMode(j, Leg.Open);
        }
      } else if (j === Event.Hall) {
        const theta = x[State.Angle] as number;
        const width = SECTOR_RAD / this.input.params.polePairs;
        if (theta >= this.thetaNext - 1e-12 * width) {
          this.sectorIndex = (this.sectorIndex + 1) % 6;
          this.thetaPrev = this.thetaNext;
          this.thetaNext += width;
        } else {
          this.sectorIndex = (this.sectorIndex + 5) % 6;
          this.thetaNext = this.thetaPrev;
          this.thetaPrev -= width;
        }
        this.highLeg = SECTOR_HIGH_LEG[this.sectorIndex] as number;
        this.lowLeg = SECTOR_LOW_LEG[this.sectorIndex] as number;
        this.refreshLegs();
      } else if (j === Event.Hysteresis) {
        this.hysteresisOn = !this.hysteresisOn;
        this.refreshLegs();
      } else if (j === Event.Standstill) {
        x[State.Speed] = 0;
        this.k1Valid = false;
      } else if (j === Event.LoadStep) {
        this.input.load.active = 1;
        this.stepPendingSpeed = Infinity;
        this.k1Valid = false;
      }
    }
    this.k1Valid = false;
  }

  private nextTimeEvent(): number {
    return Math.min(this.pwmNextEdge, this.stepPendingTime);
  }

  private handleTimeEvents(): void {
    const now = this.t + this.tolerance;
    if (this.stepPendingTime <= now) {
      this.input.load.active = 1;
      this.stepPendingTime = Infinity;
      this.k1Valid = false;
      this.timeEvents += 1;
    }
    while (this.pwmNextEdge <= now) {
      this.timeEvents += 1;
      const period = this.input.pwmPeriodS;
      if (this.pwmNextIsStart) {
        this.pwmIndex = Math.round(this.pwmNextEdge / period);
        const start = this.pwmIndex * period;
        if (this.duty >= 1) {
          this.pwmOn = true;
          this.pwmNextEdge = start + period;
        } else if (this.duty <= 0) {
          this.pwmOn = false;
          this.pwmNextEdge = start + period;
        } else {
          this.pwmOn = true;
          this.pwmNextEdge = start + this.duty * period;
          this.pwmNextIsStart = false;
        }
      } else {
        this.pwmOn = false;
        this.pwmNextEdge = (this.pwmIndex + 1) * period;
        this.pwmNextIsStart = true;
      }
      this.refreshLegs();
    }
  }

  /** One controller sample: speed PI → current reference; current PI → duty, or the hysteresis gate. */
  private control(): void {
    const input = this.input;
    const x = this.x;
    const speed = x[State.Speed] as number;
    if (input.setSpeedRadS !== null) {
      this.currentRef = this.speedPi.update(rampedReference(this.t, input.setSpeedRadS, input.rampS) - speed, 0);
    } else {
      this.currentRef = input.currentLimitA;
    }
    const measured = this.maxCurrent(x);
    if (input.hysteresis) {
      // The thresholds moved with the reference: the event values must be recomputed.
      this.k1Valid = false;
      const half = 0.5 * input.bandA;
      const before = this.hysteresisOn;
      if (this.hysteresisOn && measured >= this.currentRef + half) this.hysteresisOn = false;
      else if (!this.hysteresisOn && measured <= this.currentRef - half) this.hysteresisOn = true;
      if (before !== this.hysteresisOn) this.refreshLegs();
      return;
    }
    let duty = 1;
    if (Number.isFinite(this.currentRef)) {
      // Back-EMF feed-forward of the line flat-top EMF, 2·k_e·ω / V_dc ([2] §9.5).
      const feedForward = (2 * input.params.backEmfConstantVsPerRad * speed) / (x[State.DcBus] as number);
      duty = this.currentPi.update(this.currentRef - measured, feedForward);
    }
    if (duty !== this.duty) {
      this.duty = duty;
      if (!input.switched) this.refreshLegs();
    }
  }

  private record(): void {
    this.ensureStart();
    const series = this.series;
    const i = series.length;
    if (i >= this.input.capacity) return;
    const values = series.values;
    const x = this.x;
    const aux = this.auxStart;
    const vdc = x[State.DcBus] as number;
    values.timeS[i] = this.t;
    values.speedRpm[i] = ((x[State.Speed] as number) * 60) / (2 * Math.PI);
    values.torqueNm[i] = aux[Aux.Torque] as number;
    values.loadTorqueNm[i] = aux[Aux.LoadTorque] as number;
    values.phaseCurrentAA[i] = x[State.CurrentA] as number;
    values.phaseCurrentBA[i] = x[State.CurrentA + 1] as number;
    values.phaseCurrentCA[i] = x[State.CurrentA + 2] as number;
    values.phaseVoltageAV[i] = aux[Aux.PhaseV] as number;
    values.phaseVoltageBV[i] = aux[Aux.PhaseV + 1] as number;
    values.phaseVoltageCV[i] = aux[Aux.PhaseV + 2] as number;
    values.backEmfAV[i] = aux[Aux.Emf] as number;
    values.backEmfBV[i] = aux[Aux.Emf + 1] as number;
    values.backEmfCV[i] = aux[Aux.Emf + 2] as number;
    values.dcLinkCurrentA[i] = (aux[Aux.InputPower] as number) / vdc;
    values.dcBusV[i] = vdc;
    series.length = i + 1;
  }
}

/**
 * Starts a simulation that the caller advances in chunks (for a worker with progress and cancel).
 * @param input run input (see SimulationInput; SI units, rpm where named)
 * @param paramsField how the parameters are named in error messages
 * @returns a stepped run: advance(maxSteps) → fraction done [-], done, result()
 */
export function startSimulation(input: SimulationInput, paramsField = 'params'): SteppedRun<SimulationResult> {
  return new BldcSimulation(resolveSimulationInput(input, paramsField));
}

/**
 * Runs a simulation to its end (see the module comment for the method).
 * @param input run input
 * @param options progress callback, cancel check, chunk size
 * @returns summary, decimated series (Float64Array), counters and assumptions
 * References: Pillay & Krishnan (1989); Krishnan (2001) ch. 9; Hairer, Nørsett & Wanner (1993).
 */
export function simulate(input: SimulationInput, options: ProgressOptions = {}): SimulationResult {
  return runToEnd(startSimulation(input), options);
}
