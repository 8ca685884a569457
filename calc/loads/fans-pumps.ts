/**
 * Shaft power of fans and pumps at part flow, by control method: direct on line (on/off cycling),
 * throttling valve, outlet damper, inlet vanes, variable-speed drive (affinity laws with static head).
 *
 * References:
 * [1] Affinity laws of centrifugal machines (same impeller, same density): Q ∝ n, H ∝ n², P ∝ n³;
 *     with static head the system curve H = H_s + k·Q² (REFERENCES.md section 6); US DOE Industrial
 *     Assessment Center example: a 50 kW fan slowed from 1200 to 960 rpm draws 50·0.8³ = 25.6 kW.
 * [2] Part-flow power curves of throttled pumps and of fans with outlet dampers and inlet vanes as
 *     drawn in fan and pump system handbooks (e.g. US DOE "Improving Fan System Performance" and
 *     "Improving Pumping System Performance" sourcebooks); the straight-line and quadratic fits below
 *     are Statorline's readings of those typical curves, values from memory.
 */
import { CalcInputError, requireInRange } from '../errors.js';

export type ControlMethod = 'direct-on-line' | 'throttle-valve' | 'outlet-damper' | 'inlet-vanes' | 'variable-speed-drive';
export type Application = 'fan' | 'pump' | 'compressor' | 'conveyor' | 'mixer' | 'other';

export const CONTROL_METHODS: readonly ControlMethod[] = ['direct-on-line', 'throttle-valve', 'outlet-damper', 'inlet-vanes', 'variable-speed-drive'];

/** Throttled centrifugal pump: P/P_design = 0.45 + 0.55·q (shut-off power about 45 %; [2], value from memory). */
export const THROTTLE_VALVE_POWER = { atZeroFlow: 0.45, slope: 0.55 } as const;
/** Fan with outlet damper: P/P_design = 0.5 + 0.5·q ([2], value from memory). */
export const OUTLET_DAMPER_POWER = { atZeroFlow: 0.5, slope: 0.5 } as const;
/** Fan with inlet vanes: P/P_design = 0.3 + 0.2·q + 0.5·q² ([2], value from memory). */
export const INLET_VANES_POWER = { atZeroFlow: 0.3, linear: 0.2, quadratic: 0.5 } as const;
/** Static head of a pump system as a fraction of its design head, when not given [-] (common practice). */
export const DEFAULT_PUMP_STATIC_HEAD_FRACTION = 0.2;

/** Where a fan or pump runs at one flow bin. */
export interface FlowOperatingPoint {
  /** Shaft power / shaft power at design flow [-]. */
  powerFraction: number;
  /** Speed / rated speed [-]. */
  speedFraction: number;
  /** Fraction of the bin's hours the machine runs [-] (below 1 only for on/off control). */
  runFraction: number;
}

/**
 * Shaft power, speed and running time of a fan or pump at a fraction of its design flow.
 *
 * @param controlMethod how the flow is controlled
 * @param flowFraction flow / design flow q [-], 0–1.25 (for on/off: the time-averaged flow)
 * @param staticHeadFraction static head / design head h_s [-], 0–0.95 (0 for fans)
 * @returns operating point:
 *   - direct-on-line: runs at design flow a fraction q of the time: P = 1, run = q;
 *   - throttle-valve: P = 0.45 + 0.55·q; outlet-damper: P = 0.5 + 0.5·q;
 *     inlet-vanes: P = 0.3 + 0.2·q + 0.5·q² (full speed) [2];
 *   - variable-speed-drive: P = q·(h_s + (1 − h_s)·q²), n = √(h_s + (1 − h_s)·q²), i.e. the
 *     hydraulic power on the system curve at constant machine efficiency; with h_s = 0 the cube law
 *     P = q³, n = q [1].
 */
export function flowOperatingPoint(controlMethod: ControlMethod, flowFraction: number, staticHeadFraction: number): FlowOperatingPoint {
  requireInRange('flowFraction', flowFraction, 0, 1.25);
  requireInRange('staticHeadFraction', staticHeadFraction, 0, 0.95);
  const q = flowFraction;
  switch (controlMethod) {
    case 'direct-on-line':
      return { powerFraction: 1, speedFraction: 1, runFraction: q };
    case 'throttle-valve':
      return { powerFraction: THROTTLE_VALVE_POWER.atZeroFlow + THROTTLE_VALVE_POWER.slope * q, speedFraction: 1, runFraction: 1 };
    case 'outlet-damper':
      return { powerFraction: OUTLET_DAMPER_POWER.atZeroFlow + OUTLET_DAMPER_POWER.slope * q, speedFraction: 1, runFraction: 1 };
    case 'inlet-vanes':
      return {
        powerFraction: INLET_VANES_POWER.atZeroFlow + INLET_VANES_POWER.linear * q + INLET_VANES_POWER.quadratic * q * q,
        speedFraction: 1,
        runFraction: 1,
      };
    case 'variable-speed-drive': {
      const headFraction = staticHeadFraction + (1 - staticHeadFraction) * q * q; // system curve [1]
      if (q === 0) return { powerFraction: 0, speedFraction: 0, runFraction: 0 };
      return { powerFraction: q * headFraction, speedFraction: Math.sqrt(headFraction), runFraction: 1 };
    }
    default:
      throw new CalcInputError('controlMethod', `must be one of ${CONTROL_METHODS.join(', ')}`);
  }
}

/**
 * Affinity laws: power of a centrifugal machine at a new speed.
 *
 * @param powerKw power at the original speed [kW]; @param fromSpeedRpm [rpm]; @param toSpeedRpm [rpm]
 * @returns P₂ = P₁·(n₂/n₁)³ [kW] (system curve through the origin).
 * References: [1].
 */
export function affinityPowerKw(powerKw: number, fromSpeedRpm: number, toSpeedRpm: number): number {
  requireInRange('powerKw', powerKw, 0, Number.MAX_VALUE);
  requireInRange('fromSpeedRpm', fromSpeedRpm, Number.MIN_VALUE, Number.MAX_VALUE);
  requireInRange('toSpeedRpm', toSpeedRpm, 0, Number.MAX_VALUE);
  return powerKw * (toSpeedRpm / fromSpeedRpm) ** 3; // P ∝ n³ [1]
}

/** True for the loads whose flow a speed control can set instead of a throttle, damper, vanes or on/off. */
export function speedControlApplies(application: Application, controlMethod: ControlMethod): boolean {
  return (application === 'fan' || application === 'pump') && controlMethod !== 'variable-speed-drive';
}
