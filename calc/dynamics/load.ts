/**
 * Load torque on the shaft: constant (conveyor, positive-displacement pump), proportional to speed
 * squared (fan, centrifugal pump: affinity laws), or a constant torque switched on as a step.
 *
 * References: affinity laws of fans and centrifugal pumps (fan and pump system handbooks);
 * R. Krishnan, Electric Motor Drives, 2001, §1.4 (load torque characteristics). Static friction
 * treatment at standstill: common practice.
 */
import { CalcInputError, requireNonNegative, requirePositive } from '../errors.js';

export type LoadKind = 'constant' | 'quadratic' | 'step';

/** The load as a command gives it. */
export interface LoadInput {
  kind: LoadKind;
  /** Constant or step torque; for a quadratic load the torque at atSpeedRpm [N·m]. */
  torqueNm: number;
  /** Quadratic: speed at which the load takes torqueNm [rpm]. Step: speed at which the step is applied [rpm]. */
  atSpeedRpm?: number;
  /** Step: time at which the step is applied [s] (wins over atSpeedRpm). */
  atTimeS?: number;
  /** Load inertia added to the rotor's [kg·m²]. */
  inertiaKgM2?: number;
}

export const LOAD_CONSTANT = 0;
export const LOAD_QUADRATIC = 1;

/** Mutable load state the derivative reads (numbers only, so the inner loop allocates nothing). */
export interface LoadState {
  /** LOAD_CONSTANT (also a step once applied) or LOAD_QUADRATIC. */
  kind: number;
  /** Constant torque [N·m]. */
  torqueNm: number;
  /** Quadratic coefficient k in T = k·ω·|ω| [N·m·s²/rad²]. */
  quadraticCoefficient: number;
  /** 1 when the load acts, 0 before a step. */
  active: number;
}

/**
 * Load torque at a speed ([N·m]). Constant load opposes motion; at standstill it holds the shaft
 * like static friction up to its value (it cannot drive the motor backwards): T_L = clamp(T_drive,
 * −T_0, T_0) at ω = 0. Quadratic load: T_L = k·ω·|ω| with k = T_0/ω_0².
 * @param load load state
 * @param speed mechanical speed [rad/s]
 * @param drivingTorque motor torque less friction at this instant [N·m] (used at standstill only)
 */
export function loadTorque(load: LoadState, speed: number, drivingTorque: number): number {
  if (load.active === 0) return 0;
  if (load.kind === LOAD_QUADRATIC) return load.quadraticCoefficient * speed * Math.abs(speed);
  if (speed > 0) return load.torqueNm;
  if (speed < 0) return -load.torqueNm;
  return Math.max(-load.torqueNm, Math.min(load.torqueNm, drivingTorque));
}

/**
 * Builds the load state from the command's load input.
 * @param input load input
 * @param setSpeedRpm speed loop set point [rpm], the default reference of a quadratic load
 * @returns state (a step load starts inactive) and the step's trigger
 */
export function createLoadState(
  input: LoadInput,
  setSpeedRpm: number | undefined,
): { state: LoadState; stepAtTimeS: number | null; stepAtSpeedRadS: number | null } {
  requireNonNegative('load.torqueNm', input.torqueNm);
  if (input.inertiaKgM2 !== undefined) requireNonNegative('load.inertiaKgM2', input.inertiaKgM2);
  const state: LoadState = { kind: LOAD_CONSTANT, torqueNm: input.torqueNm, quadraticCoefficient: 0, active: 1 };
  if (input.kind === 'quadratic') {
    const referenceRpm = input.atSpeedRpm ?? setSpeedRpm;
    if (referenceRpm === undefined) {
      throw new CalcInputError('load.atSpeedRpm', 'is required for a quadratic load without setSpeedRpm');
    }
    requirePositive('load.atSpeedRpm', referenceRpm);
    const referenceRadS = (referenceRpm * 2 * Math.PI) / 60;
    state.kind = LOAD_QUADRATIC;
    state.quadraticCoefficient = input.torqueNm / (referenceRadS * referenceRadS);
    return { state, stepAtTimeS: null, stepAtSpeedRadS: null };
  }
  if (input.kind === 'step') {
    state.active = 0;
    if (input.atTimeS !== undefined) {
      requireNonNegative('load.atTimeS', input.atTimeS);
      return { state, stepAtTimeS: input.atTimeS, stepAtSpeedRadS: null };
    }
    if (input.atSpeedRpm !== undefined) {
      requirePositive('load.atSpeedRpm', input.atSpeedRpm);
      return { state, stepAtTimeS: null, stepAtSpeedRadS: (input.atSpeedRpm * 2 * Math.PI) / 60 };
    }
    return { state, stepAtTimeS: null, stepAtSpeedRadS: null };
  }
  return { state, stepAtTimeS: null, stepAtSpeedRadS: null };
}
