/**
 * Sampled speed and current controllers of the six-step drive: PI with clamping anti-windup, the
 * speed reference ramp, and default gains from the equivalent DC-motor model.
 *
 * References:
 * [1] R. Krishnan, Electric Motor Drives, 2001, §9.5 (speed and current controller design of the
 *     PM brushless DC drive by the equivalent DC-motor model; pole–zero cancellation) and §3.7
 *     (symmetric optimum for the speed loop).
 * [2] K. J. Åström, T. Hägglund, Advanced PID Control, ISA, 2006, §3.5 (integrator anti-windup by
 *     conditional integration).
 */

/** Current-loop bandwidth as a fraction of the controller's sampling rate [-] (common practice: 1/10–1/20). */
export const CURRENT_BANDWIDTH_FRACTION_OF_SAMPLING = 1 / 20;
/** Speed-loop bandwidth as a fraction of the current loop's [-] (common practice: at least a decade apart). */
export const SPEED_BANDWIDTH_FRACTION_OF_CURRENT = 1 / 10;
/** Symmetric-optimum spacing a: integral corner at ω_c/a² [-] (a = 2, [1] §3.7). */
export const SYMMETRIC_OPTIMUM_SPACING = 2;

/** PI gains of both loops. Speed: A per rad/s and A per rad; current: 1/A and 1/(A·s) (duty per ampere). */
export interface ControllerGains {
  speedKp: number;
  speedKi: number;
  currentKp: number;
  currentKi: number;
}

/** A sampled PI controller with output limits and conditional integration; fields only, no allocation. */
export class PiController {
  integral = 0;

  constructor(
    public kp: number,
    public ki: number,
    public samplePeriodS: number,
    public min: number,
    public max: number,
  ) {}

  /**
   * One sample: u = feedForward + kp·e + ∫ki·e, clamped to [min, max]; the integral only grows
   * while the output is not pushed further into its limit ([2] §3.5).
   * @param error reference minus measurement [unit of the loop]
   * @param feedForward added to the output before clamping [output unit]
   * @returns output [output unit]
   */
  update(error: number, feedForward: number): number {
    const candidateIntegral = this.integral + this.ki * this.samplePeriodS * error;
    const unclamped = feedForward + this.kp * error + candidateIntegral;
    if (unclamped > this.max) {
      if (error < 0) this.integral = candidateIntegral;
      return this.max;
    }
    if (unclamped < this.min) {
      if (error > 0) this.integral = candidateIntegral;
      return this.min;
    }
    this.integral = candidateIntegral;
    return unclamped;
  }
}

/**
 * Default gains from the equivalent DC motor of the six-step drive ([1] §9.5): two phases in series,
 * resistance 2R, inductance 2(L − M), torque constant K_t = 2·k_e.
 * Current loop (pole–zero cancellation, plant V_dc/(2R + 2(L−M)s)): K_p = 2(L−M)·ω_ci/V_dc,
 * K_i = 2R·ω_ci/V_dc, with ω_ci = 2π·f_s·CURRENT_BANDWIDTH_FRACTION_OF_SAMPLING.
 * Speed loop (symmetric optimum on K_t/(J s)): K_p = J·ω_cs/K_t, K_i = K_p·ω_cs/a², ω_cs = ω_ci·SPEED_BANDWIDTH_FRACTION_OF_CURRENT.
 * @param resistanceOhm phase resistance R [Ω]
 * @param effectiveInductanceH L − M [H]
 * @param backEmfConstantVsPerRad k_e [V·s/rad]
 * @param totalInertiaKgM2 motor and load inertia [kg·m²]
 * @param dcBusV nominal DC-link voltage [V]
 * @param samplePeriodS controller sampling period [s]
 */
export function defaultGains(
  resistanceOhm: number,
  effectiveInductanceH: number,
  backEmfConstantVsPerRad: number,
  totalInertiaKgM2: number,
  dcBusV: number,
  samplePeriodS: number,
): ControllerGains {
  const currentBandwidth = (2 * Math.PI * CURRENT_BANDWIDTH_FRACTION_OF_SAMPLING) / samplePeriodS;
  const speedBandwidth = currentBandwidth * SPEED_BANDWIDTH_FRACTION_OF_CURRENT;
  const torqueConstant = 2 * backEmfConstantVsPerRad;
  const speedKp = (totalInertiaKgM2 * speedBandwidth) / torqueConstant;
  return {
    speedKp,
    speedKi: (speedKp * speedBandwidth) / (SYMMETRIC_OPTIMUM_SPACING * SYMMETRIC_OPTIMUM_SPACING),
    currentKp: (2 * effectiveInductanceH * currentBandwidth) / dcBusV,
    currentKi: (2 * resistanceOhm * currentBandwidth) / dcBusV,
  };
}

/**
 * Ramped speed reference [rad/s]: rises linearly from 0 at t = 0 to the set speed at t = rampS.
 * @param timeS time [s]
 * @param setSpeedRadS set speed [rad/s]
 * @param rampS ramp time [s]; 0 gives a step
 */
export function rampedReference(timeS: number, setSpeedRadS: number, rampS: number): number {
  if (rampS <= 0 || timeS >= rampS) return setSpeedRadS;
  return (setSpeedRadS * timeS) / rampS;
}
