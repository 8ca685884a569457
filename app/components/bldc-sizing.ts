// The BLDC sizing page's form model and the pure helpers around it: what the inputs hold, how a
// register motor or a stored design fills them, the `size-bldc` request they make, and the labels
// of targets, sweep parameters and sweep outputs. calc's small modules only (frames, materials,
// defaults); the design search itself runs in a worker or on the server.
import { DEFAULT_TARGETS, type DesignTargets } from 'calc/bldc/defaults';
import { frameLimits, listFrames, type FrameLimits } from 'calc/bldc/frames';
import type { SizeBldcInput } from 'shared/design';
import type { MotorOutput } from 'shared/motor';

export type FrameMode = 'standard' | 'iec' | 'nema' | 'free';
export type TargetKey = keyof DesignTargets;

export interface BldcForm {
  name: string;
  ratedPowerKw: number | null;
  speedRpm: number | null;
  supplyType: 'ac' | 'dc';
  supplyVoltageV: number | null;
  frequencyHz: number | null;
  frameMode: FrameMode;
  frame: string | null;
  maxStatorOuterDiameterMm: number | null;
  maxStackLengthMm: number | null;
  cooling: 'tefc' | 'natural';
  drive: 'six-step' | 'sinusoidal';
  magnet: string;
  steel: string;
  objective: 'cost' | 'efficiency' | 'mass';
  targets: Record<TargetKey, number | null>;
  slots: number | null;
  poles: number | null;
  minEfficiencyPct: number | null;
}

export interface TargetField {
  key: TargetKey;
  label: string;
  unit: string;
  step: string;
  hint?: string;
}

/** The design targets an engineer may change, in the order the form shows them. */
export const TARGET_FIELDS: readonly TargetField[] = [
  { key: 'airgapFluxDensityT', label: 'Air-gap flux density', unit: 'T', step: '0.05' },
  { key: 'currentDensityAPerMm2', label: 'Current density', unit: 'A/mm²', step: '0.5', hint: 'sets the electric loading with the slot fill' },
  { key: 'toothFluxDensityT', label: 'Tooth flux density', unit: 'T', step: '0.05' },
  { key: 'yokeFluxDensityT', label: 'Yoke flux density', unit: 'T', step: '0.05' },
  { key: 'slotFill', label: 'Net slot fill', unit: '', step: '0.01' },
  { key: 'voltageMarginPct', label: 'Voltage margin', unit: '%', step: '1' },
  { key: 'magnetTemperatureC', label: 'Magnet temperature', unit: '°C', step: '5' },
  { key: 'windingTemperatureC', label: 'Winding temperature', unit: '°C', step: '5' },
  { key: 'poleArcFraction', label: 'Magnet arc / pole pitch', unit: '', step: '0.05' },
  { key: 'airgapMm', label: 'Air gap (0 = by bore)', unit: 'mm', step: '0.1' },
  { key: 'currentLimitFactor', label: 'Drive current limit', unit: '× rated', step: '0.1' },
  { key: 'minDemagnetisationMarginPct', label: 'Least demagnetisation margin', unit: '%', step: '1' },
];

export const OBJECTIVES = [
  { value: 'cost', label: 'Lowest active-material cost' },
  { value: 'efficiency', label: 'Highest efficiency' },
  { value: 'mass', label: 'Lowest active mass' },
] as const;

export const COOLING_OPTIONS = [
  { value: 'tefc', label: 'Enclosed, shaft fan' },
  { value: 'natural', label: 'Enclosed, no fan' },
] as const;

export const DRIVE_OPTIONS = [
  { value: 'six-step', label: 'Six-step (trapezoidal)' },
  { value: 'sinusoidal', label: 'Sinusoidal' },
] as const;

export const FRAME_MODES = [
  { value: 'standard', label: 'Standard for the rating' },
  { value: 'iec', label: 'IEC frame' },
  { value: 'nema', label: 'NEMA frame' },
  { value: 'free', label: 'Free limits' },
] as const;

export function emptyTargets(): Record<TargetKey, number | null> {
  return Object.fromEntries(TARGET_FIELDS.map((field) => [field.key, null])) as Record<TargetKey, number | null>;
}

export function defaultTarget(key: TargetKey): number {
  return DEFAULT_TARGETS[key];
}

export function emptyForm(): BldcForm {
  return {
    name: '',
    ratedPowerKw: null,
    speedRpm: null,
    supplyType: 'ac',
    supplyVoltageV: 400,
    frequencyHz: 50,
    frameMode: 'standard',
    frame: null,
    maxStatorOuterDiameterMm: null,
    maxStackLengthMm: null,
    cooling: 'tefc',
    drive: 'six-step',
    magnet: 'N42H',
    steel: 'M330-35A',
    objective: 'cost',
    targets: emptyTargets(),
    slots: null,
    poles: null,
    minEfficiencyPct: null,
  };
}

/** IEC or NEMA, or null for a designation calc does not know. */
export function frameSystem(designation: string | null | undefined): 'iec' | 'nema' | null {
  if (!designation) return null;
  try {
    return frameLimits(designation).system === 'NEMA' ? 'nema' : 'iec';
  } catch {
    return null;
  }
}

export function framesOf(system: 'iec' | 'nema'): FrameLimits[] {
  return listFrames().filter((frame) => frame.system === (system === 'iec' ? 'IEC' : 'NEMA'));
}

/** The inputs for a register motor: its rating, nameplate speed (or synchronous speed), supply and frame. */
export function formFromMotor(motor: MotorOutput, base: BldcForm = emptyForm()): BldcForm {
  const system = frameSystem(motor.frame);
  return {
    ...base,
    name: `BLDC for ${motor.tag}`,
    ratedPowerKw: motor.ratedPowerKw,
    speedRpm: motor.speedRpm ?? Math.round((120 * motor.frequencyHz) / motor.poles),
    supplyType: 'ac',
    supplyVoltageV: motor.voltageV,
    frequencyHz: motor.frequencyHz,
    frameMode: system ?? 'standard',
    frame: system ? frameLimits(motor.frame as string).designation : null,
  };
}

const num = (value: unknown): number | null => (typeof value === 'number' && Number.isFinite(value) ? value : null);

/** The inputs of a stored design (its `input` as the server kept it). */
export function formFromInput(input: Record<string, unknown>, name = ''): BldcForm {
  const form = emptyForm();
  const frame = typeof input.frame === 'string' ? input.frame : null;
  const system = frameSystem(frame);
  const freeLimits = num(input.maxStatorOuterDiameterMm) !== null || num(input.maxStackLengthMm) !== null;
  const targets = (typeof input.targets === 'object' && input.targets !== null ? input.targets : {}) as Record<string, unknown>;
  return {
    ...form,
    name,
    ratedPowerKw: num(input.ratedPowerKw),
    speedRpm: num(input.speedRpm),
    supplyType: input.supplyType === 'dc' ? 'dc' : 'ac',
    supplyVoltageV: num(input.supplyVoltageV),
    frequencyHz: num(input.frequencyHz) ?? (input.supplyType === 'dc' ? null : 50),
    frameMode: system ?? (freeLimits ? 'free' : 'standard'),
    frame: system && frame ? frameLimits(frame).designation : null,
    maxStatorOuterDiameterMm: num(input.maxStatorOuterDiameterMm),
    maxStackLengthMm: num(input.maxStackLengthMm),
    cooling: input.cooling === 'natural' ? 'natural' : 'tefc',
    drive: input.drive === 'sinusoidal' ? 'sinusoidal' : 'six-step',
    magnet: typeof input.magnet === 'string' ? input.magnet : typeof input.magnet === 'object' && input.magnet !== null ? String((input.magnet as { name?: unknown }).name ?? form.magnet) : form.magnet,
    steel: typeof input.steel === 'string' ? input.steel : typeof input.steel === 'object' && input.steel !== null ? String((input.steel as { name?: unknown }).name ?? form.steel) : form.steel,
    objective: input.objective === 'efficiency' || input.objective === 'mass' ? input.objective : 'cost',
    targets: Object.fromEntries(TARGET_FIELDS.map((field) => [field.key, num(targets[field.key])])) as Record<TargetKey, number | null>,
    slots: num(input.slots),
    poles: num(input.poles),
    minEfficiencyPct: num(input.minEfficiencyPct),
  };
}

/**
 * The `size-bldc` request of the form: blanks left out (calc's defaults apply), the frame as the
 * mode says. Missing required numbers are sent as null so the schema names them.
 */
export function requestFromForm(form: BldcForm): SizeBldcInput {
  const request: Record<string, unknown> = {
    ratedPowerKw: form.ratedPowerKw,
    speedRpm: form.speedRpm,
    supplyVoltageV: form.supplyVoltageV,
    supplyType: form.supplyType,
    cooling: form.cooling,
    drive: form.drive,
    magnet: form.magnet,
    steel: form.steel,
    objective: form.objective,
  };
  if (form.supplyType === 'ac' && form.frequencyHz !== null) request.frequencyHz = form.frequencyHz;
  if ((form.frameMode === 'iec' || form.frameMode === 'nema') && form.frame) request.frame = form.frame;
  if (form.frameMode === 'iec' || form.frameMode === 'nema') {
    if (!form.frame) request.frame = null;
  }
  if (form.frameMode === 'free') {
    request.maxStatorOuterDiameterMm = form.maxStatorOuterDiameterMm;
    request.maxStackLengthMm = form.maxStackLengthMm;
  }
  const targets: Partial<Record<TargetKey, number>> = {};
  for (const field of TARGET_FIELDS) {
    const value = form.targets[field.key];
    if (value !== null) targets[field.key] = value;
  }
  if (Object.keys(targets).length > 0) request.targets = targets;
  if (form.slots !== null) request.slots = form.slots;
  if (form.poles !== null) request.poles = form.poles;
  if (form.minEfficiencyPct !== null) request.minEfficiencyPct = form.minEfficiencyPct;
  return request as SizeBldcInput;
}

/** Form labels for messages ("Rated power must be positive"), by request path. */
export const FIELD_LABELS: Record<string, string> = {
  ratedPowerKw: 'Rated power',
  speedRpm: 'Speed',
  supplyVoltageV: 'Supply voltage',
  frequencyHz: 'Frequency',
  frame: 'Frame',
  maxStatorOuterDiameterMm: 'Largest stator diameter',
  maxStackLengthMm: 'Largest stack length',
  magnet: 'Magnet grade',
  steel: 'Lamination steel',
  slots: 'Slots',
  poles: 'Poles',
  minEfficiencyPct: 'Least efficiency',
  name: 'Name',
  ...Object.fromEntries(TARGET_FIELDS.map((field) => [`targets.${field.key}`, field.label])),
};

/** The parameters a sweep may vary (calc's SWEEPABLE_PARAMETERS) with their labels and units. */
export const SWEEP_PARAMETERS: ReadonlyArray<{ value: string; label: string; unit: string }> = [
  { value: 'ratedPowerKw', label: 'Rated power', unit: 'kW' },
  { value: 'speedRpm', label: 'Speed', unit: 'rpm' },
  { value: 'supplyVoltageV', label: 'Supply voltage', unit: 'V' },
  { value: 'maxStatorOuterDiameterMm', label: 'Largest stator diameter', unit: 'mm' },
  { value: 'maxStackLengthMm', label: 'Largest stack length', unit: 'mm' },
  { value: 'minEfficiencyPct', label: 'Least efficiency', unit: '%' },
  ...TARGET_FIELDS.map((field) => ({ value: `targets.${field.key}`, label: field.label, unit: field.unit })),
];

/** The figures a sweep row carries (calc's SweepRow), with labels, units and digits. */
export const SWEEP_OUTPUTS: ReadonlyArray<{ value: string; label: string; unit: string; digits: number }> = [
  { value: 'efficiencyPct', label: 'Motor efficiency', unit: '%', digits: 2 },
  { value: 'systemEfficiencyPct', label: 'Motor + drive efficiency', unit: '%', digits: 2 },
  { value: 'activeMaterialCost', label: 'Active-material cost', unit: '', digits: 0 },
  { value: 'totalMassKg', label: 'Active mass', unit: 'kg', digits: 1 },
  { value: 'powerDensityKwPerKg', label: 'Power density', unit: 'kW/kg', digits: 3 },
  { value: 'demagnetisationMarginPct', label: 'Demagnetisation margin', unit: '%', digits: 1 },
  { value: 'magnetThicknessMm', label: 'Magnet thickness', unit: 'mm', digits: 2 },
  { value: 'stackLengthMm', label: 'Stack length', unit: 'mm', digits: 1 },
  { value: 'statorOuterDiameterMm', label: 'Stator diameter', unit: 'mm', digits: 1 },
  { value: 'torquePerRotorVolumeKnmPerM3', label: 'Torque per rotor volume', unit: 'kN·m/m³', digits: 1 },
  { value: 'currentDensityAPerMm2', label: 'Current density', unit: 'A/mm²', digits: 2 },
  { value: 'turnsPerPhase', label: 'Turns per phase', unit: '', digits: 0 },
  { value: 'copperW', label: 'Copper loss', unit: 'W', digits: 0 },
  { value: 'ironW', label: 'Iron loss', unit: 'W', digits: 0 },
];

/** A number for a table cell; an en dash when absent. */
export function fmt(value: number | null | undefined, digits = 1): string {
  if (value === null || value === undefined || !Number.isFinite(value)) return '–';
  return new Intl.NumberFormat('en-GB', { maximumFractionDigits: digits, minimumFractionDigits: 0 }).format(value);
}

/** Phase colours of the winding drawing and table (Statorline's own palette). */
export const PHASE_COLOURS: Record<'A' | 'B' | 'C', string> = { A: '#1f5f5b', B: '#c9822b', C: '#5b4b8a' };
