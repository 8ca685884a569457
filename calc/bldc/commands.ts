/**
 * The `winding`, `size-bldc` and `sweep` commands: zod schemas of their JSON inputs and the calls.
 * Outputs are plain JSON (the server stores them, the client draws the cross-section, the winding
 * table and the charts from them).
 */
import { z } from 'zod';
import { CalcInputError } from '../errors.js';
import { parseInput } from '../input.js';
import { sizeBldc, type BldcInput, type BldcResult } from './search.js';
import { sweep, type SweepRow } from './sweep.js';
import { windingLayout, type WindingLayout } from './winding.js';

const positive = z.number().positive('must be positive');

const magnetSchema = z.object({
  name: z.string(),
  family: z.enum(['sintered-ndfeb', 'bonded-ndfeb', 'ferrite']),
  remanenceT: positive,
  intrinsicCoercivityAPerM: positive,
  remanenceTempCoeffPerK: z.number(),
  coercivityTempCoeffPerK: z.number(),
  recoilPermeability: positive,
  maxTemperatureC: z.number(),
  densityKgPerM3: positive,
  conductivitySPerM: z.number().min(0),
  pricePerKg: z.number().min(0),
  source: z.string().default('user material'),
});

const steelSchema = z.object({
  name: z.string(),
  thicknessM: positive,
  hysteresisCoeff: z.number().min(0),
  steinmetzExponent: positive,
  eddyCoeff: z.number().min(0),
  saturationT: positive,
  densityKgPerM3: positive,
  stackingFactor: z.number().gt(0).max(1),
  pricePerKg: z.number().min(0),
  source: z.string().default('user material'),
});

const targetsSchema = z
  .object({
    airgapFluxDensityT: z.number(),
    toothFluxDensityT: z.number(),
    yokeFluxDensityT: z.number(),
    currentDensityAPerMm2: z.number(),
    slotFill: z.number(),
    voltageMarginPct: z.number(),
    magnetTemperatureC: z.number(),
    windingTemperatureC: z.number(),
    poleArcFraction: z.number(),
    airgapMm: z.number(),
    currentLimitFactor: z.number(),
    minDemagnetisationMarginPct: z.number(),
  })
  .partial()
  .strict();

export const sizeBldcInputSchema = z
  .object({
    ratedPowerKw: positive,
    speedRpm: positive,
    supplyVoltageV: positive,
    supplyType: z.enum(['ac', 'dc']).optional(),
    frequencyHz: positive.optional(),
    frame: z.string().optional(),
    maxStatorOuterDiameterMm: positive.optional(),
    maxStackLengthMm: positive.optional(),
    magnet: z.union([z.string(), magnetSchema]).optional(),
    steel: z.union([z.string(), steelSchema]).optional(),
    objective: z.enum(['cost', 'efficiency', 'mass']).optional(),
    cooling: z.enum(['tefc', 'natural']).optional(),
    drive: z.enum(['six-step', 'sinusoidal']).optional(),
    targets: targetsSchema.optional(),
    slots: z.number().int().optional(),
    poles: z.number().int().optional(),
    layers: z.union([z.literal(1), z.literal(2)]).optional(),
    coilPitch: z.number().int().optional(),
    minEfficiencyPct: positive.optional(),
    alternatives: z.number().int().min(1).max(10).optional(),
  })
  .strict();

export const windingInputSchema = z
  .object({
    slots: z.number().int(),
    poles: z.number().int(),
    layers: z.union([z.literal(1), z.literal(2)]).default(2),
    coilPitch: z.number().int().optional(),
  })
  .strict();

export const sweepInputSchema = z
  .object({
    base: z.unknown(),
    parameter: z.string(),
    from: z.number(),
    to: z.number(),
    steps: z.number().int(),
  })
  .strict();

/** Removes undefined optional fields (exactOptionalPropertyTypes). */
function defined<T extends object>(value: T): T {
  return Object.fromEntries(Object.entries(value).filter(([, v]) => v !== undefined)) as T;
}

/** `winding` {slots, poles, layers, coilPitch?} → the layout and its winding factors. */
export function runWindingCommand(input: unknown): WindingLayout {
  const parsed = parseInput(windingInputSchema, input);
  return windingLayout(parsed.slots, parsed.poles, parsed.layers, parsed.coilPitch);
}

function toBldcInput(input: unknown): BldcInput {
  return defined(parseInput(sizeBldcInputSchema, input)) as BldcInput;
}

/** `size-bldc` request → the sized design (see BldcResult). */
export function runSizeBldcCommand(input: unknown): BldcResult {
  return sizeBldc(toBldcInput(input));
}

/** `sweep` {base, parameter, from, to, steps} → {parameter, rows}. */
export function runSweepCommand(input: unknown): { parameter: string; rows: SweepRow[] } {
  const parsed = parseInput(sweepInputSchema, input);
  let base: BldcInput;
  try {
    base = toBldcInput(parsed.base);
  } catch (error) {
    if (!(error instanceof CalcInputError)) throw error;
    // Point the user at the field inside `base`.
    throw new CalcInputError(error.field ? `base.${error.field}` : 'base', error.message.replace(/^"[^"]*" /, ''));
  }
  return { parameter: parsed.parameter, rows: sweep(base, parsed.parameter, parsed.from, parsed.to, parsed.steps) };
}
