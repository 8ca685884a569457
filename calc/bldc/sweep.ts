/**
 * Sweep: vary one numeric input of a BLDC request over a range and tabulate the design's figures.
 * The slot/pole combination of the base design is kept (unless the swept input is `slots` or
 * `poles`), so the rows show the effect of the parameter on one design family.
 */
import { CalcInputError, requireInRange } from '../errors.js';
import type { DesignTargets } from './defaults.js';
import { sizeBldc, type BldcInput, type BldcResult } from './search.js';

/** Numeric inputs a sweep may vary: top-level ones and `targets.<name>`. */
export const SWEEPABLE_PARAMETERS = [
  'ratedPowerKw',
  'speedRpm',
  'supplyVoltageV',
  'maxStatorOuterDiameterMm',
  'maxStackLengthMm',
  'minEfficiencyPct',
  'slots',
  'poles',
  ...(['airgapFluxDensityT', 'toothFluxDensityT', 'yokeFluxDensityT', 'currentDensityAPerMm2', 'slotFill', 'voltageMarginPct', 'magnetTemperatureC', 'windingTemperatureC', 'poleArcFraction', 'airgapMm', 'currentLimitFactor', 'minDemagnetisationMarginPct'] satisfies Array<keyof DesignTargets>).map((name) => `targets.${name}`),
] as const;

export type SweepParameter = (typeof SWEEPABLE_PARAMETERS)[number];

/** One row of a sweep. */
export interface SweepRow {
  value: number;
  feasible: boolean;
  limitingConstraint: string;
  slots?: number;
  poles?: number;
  stackLengthMm?: number;
  statorOuterDiameterMm?: number;
  efficiencyPct?: number;
  systemEfficiencyPct?: number;
  activeMaterialCost?: number;
  totalMassKg?: number;
  powerDensityKwPerKg?: number;
  torquePerRotorVolumeKnmPerM3?: number;
  currentDensityAPerMm2?: number;
  demagnetisationMarginPct?: number;
  magnetThicknessMm?: number;
  turnsPerPhase?: number;
  copperW?: number;
  ironW?: number;
  /** Message when this value was refused as input. */
  error?: string;
}

/** Most steps of a sweep [-]. */
export const MAX_SWEEP_STEPS = 50;

function withValue(base: BldcInput, parameter: SweepParameter, value: number): BldcInput {
  if (parameter.startsWith('targets.')) {
    const key = parameter.slice('targets.'.length) as keyof DesignTargets;
    return { ...base, targets: { ...(base.targets ?? {}), [key]: value } };
  }
  return { ...base, [parameter]: value };
}

function row(value: number, r: BldcResult): SweepRow {
  return {
    value,
    feasible: r.feasible,
    limitingConstraint: r.limitingConstraint,
    ...(r.slots !== undefined ? { slots: r.slots } : {}),
    ...(r.poles !== undefined ? { poles: r.poles } : {}),
    ...(r.geometry ? { stackLengthMm: r.geometry.stackLengthMm, statorOuterDiameterMm: r.geometry.statorOuterDiameterMm, magnetThicknessMm: r.geometry.magnetThicknessMm } : {}),
    ...(r.efficiencyPct !== undefined ? { efficiencyPct: r.efficiencyPct } : {}),
    ...(r.systemEfficiencyPct !== undefined ? { systemEfficiencyPct: r.systemEfficiencyPct } : {}),
    ...(r.activeMaterialCost !== undefined ? { activeMaterialCost: r.activeMaterialCost } : {}),
    ...(r.massKg ? { totalMassKg: r.massKg.total } : {}),
    ...(r.powerDensityKwPerKg !== undefined ? { powerDensityKwPerKg: r.powerDensityKwPerKg } : {}),
    ...(r.torquePerRotorVolumeKnmPerM3 !== undefined ? { torquePerRotorVolumeKnmPerM3: r.torquePerRotorVolumeKnmPerM3 } : {}),
    ...(r.currentDensityAPerMm2 !== undefined ? { currentDensityAPerMm2: r.currentDensityAPerMm2 } : {}),
    ...(r.demagnetisationMarginPct !== undefined ? { demagnetisationMarginPct: r.demagnetisationMarginPct } : {}),
    ...(r.turnsPerPhase !== undefined ? { turnsPerPhase: r.turnsPerPhase } : {}),
    ...(r.losses ? { copperW: r.losses.copperW, ironW: r.losses.ironW } : {}),
  };
}

/**
 * Sizes the base request once, then again for each value of the parameter from `from` to `to` in
 * `steps` equal steps, keeping the base design's slots and poles.
 * @param base a size-bldc request
 * @param parameter one of SWEEPABLE_PARAMETERS
 * @param from first value; @param to last value (units of the parameter)
 * @param steps number of values [-], 2 to MAX_SWEEP_STEPS
 * @returns one row per value; a value the request refuses gives a row with `error`
 * @throws CalcInputError for an unknown parameter, bad steps or a base request that is invalid
 */
export function sweep(base: BldcInput, parameter: string, from: number, to: number, steps: number): SweepRow[] {
  if (!(SWEEPABLE_PARAMETERS as readonly string[]).includes(parameter)) throw new CalcInputError('parameter', `must be one of ${SWEEPABLE_PARAMETERS.join(', ')}`);
  if (!Number.isInteger(steps)) throw new CalcInputError('steps', 'must be a whole number');
  requireInRange('steps', steps, 2, MAX_SWEEP_STEPS);
  if (!Number.isFinite(from)) throw new CalcInputError('from', 'must be a finite number');
  if (!Number.isFinite(to)) throw new CalcInputError('to', 'must be a finite number');
  const p = parameter as SweepParameter;
  let fixed: BldcInput = base;
  if (p !== 'slots' && p !== 'poles' && (base.slots === undefined || base.poles === undefined)) {
    const first = sizeBldc(base);
    if (first.slots !== undefined && first.poles !== undefined) fixed = { ...base, slots: first.slots, poles: first.poles, ...(first.coilPitch !== undefined ? { coilPitch: first.coilPitch } : {}) };
  }
  const rows: SweepRow[] = [];
  for (let i = 0; i < steps; i += 1) {
    const value = from + ((to - from) * i) / (steps - 1);
    try {
      const input = withValue(fixed, p, p === 'slots' || p === 'poles' ? Math.round(value) : value);
      rows.push(row(value, sizeBldc(input)));
    } catch (error) {
      if (!(error instanceof CalcInputError)) throw error;
      rows.push({ value, feasible: false, limitingConstraint: error.field, error: error.message });
    }
  }
  return rows;
}
