/**
 * Part-load behaviour of a motor from its rated efficiency: losses split into a constant part
 * (iron, friction, windage) and a load-dependent part (stator and rotor I²R, stray), the reactive
 * power of an induction motor versus load, and the rewind penalty.
 *
 * References:
 * [1] IEC 60034-2-1:2014, loss segregation (constant and load losses); typical shares of the
 *     full-load losses as in REFERENCES.md section 5 (common practice).
 * [2] US DOE, "Determining Electric Motor Load and Efficiency", fact sheet, 2014 (part-load curves).
 * [3] Typical induction-motor power factor versus load, electrical-installation handbooks
 *     (0 % 0.17 · 25 % 0.55 · 50 % 0.73 · 75 % 0.80 · 100 % 0.85), REFERENCES.md section 5.
 */
import { requireInRange, requireNonNegative, requirePositive } from '../errors.js';

/**
 * Constant losses of a cage induction motor as a share of its full-load losses [-]: core 15–25 %
 * plus friction and windage 5–15 % [1], plus the stator I²R of the magnetising current that flows
 * at any load (about 5 %); 0.35 in all (common practice, no source).
 */
export const INDUCTION_CONSTANT_LOSS_SHARE = 0.35;

/**
 * Constant losses of a permanent-magnet synchronous motor as a share of its full-load losses [-]:
 * core plus friction and windage only, no magnetising current and no rotor copper, so its curve is
 * flatter at light load (common practice, no source).
 */
export const PM_CONSTANT_LOSS_SHARE = 0.3;

/**
 * Magnetising share of an induction motor's full-load reactive power [-]: Q(t) = Q_FL·s·(m + (1−m)·t²).
 * 0.65 reproduces the handbook power-factor curve [3] within 0.05 from 25 % to 100 % load
 * (fitted by Statorline; the tests check it).
 */
export const INDUCTION_MAGNETISING_REACTIVE_SHARE = 0.65;

/**
 * Exponent of speed for the constant losses under speed control [-]: hysteresis ∝ f, eddy ∝ f²,
 * friction ∝ n, windage ∝ n³ average to about s^1.5 (common practice, no source).
 */
export const CONSTANT_LOSS_SPEED_EXPONENT = 1.5;

/** Efficiency lost per recorded rewind [percentage points] (common practice: 0.5–2 points; no source). */
export const REWIND_PENALTY_PCT_POINTS = 1;

/** Losses of a machine at rated output, split as the model needs them. */
export interface LossSplit {
  /** Rated shaft output [kW]. */
  ratedPowerKw: number;
  /** Constant losses at rated speed [kW]. */
  constantLossKw: number;
  /** Load-dependent losses at rated torque [kW]. */
  loadLossKw: number;
}

/**
 * Splits full-load losses into constant and load-dependent parts.
 *
 * @param ratedPowerKw rated shaft output P_N [kW]
 * @param efficiency full-load efficiency η_N [-], 0 < η < 1
 * @param constantShare constant share k of the full-load losses [-], 0–1
 * @returns the split [kW]: P_loss,FL = P_N·(1/η_N − 1), P_c = k·P_loss,FL, P_v = (1 − k)·P_loss,FL.
 * References: [1] (REFERENCES.md section 5 model).
 */
export function lossSplit(ratedPowerKw: number, efficiency: number, constantShare: number): LossSplit {
  requirePositive('ratedPowerKw', ratedPowerKw);
  if (!(efficiency > 0 && efficiency < 1)) requireInRange('efficiency', efficiency, 1e-6, 0.999999);
  requireInRange('constantShare', constantShare, 0, 1);
  const fullLoadLossKw = ratedPowerKw * (1 / efficiency - 1);
  return { ratedPowerKw, constantLossKw: constantShare * fullLoadLossKw, loadLossKw: (1 - constantShare) * fullLoadLossKw };
}

/**
 * Losses at a speed and torque.
 *
 * @param split the machine's loss split [kW]
 * @param speedFraction speed / rated speed s [-], 0–1.25
 * @param torqueFraction torque / rated torque t [-], 0–1.25 (≈ current / rated current)
 * @returns losses [kW] = P_c·s^1.5 + P_v·t² (the constant part is zero when the machine stands still).
 * References: [1]; speed exponent CONSTANT_LOSS_SPEED_EXPONENT.
 */
export function machineLossKw(split: LossSplit, speedFraction: number, torqueFraction: number): number {
  // s·√s is s^1.5 (CONSTANT_LOSS_SPEED_EXPONENT) without a Math.pow in the hot loop.
  const constant = speedFraction === 1 ? split.constantLossKw : split.constantLossKw * speedFraction * Math.sqrt(speedFraction);
  return constant + split.loadLossKw * torqueFraction * torqueFraction;
}

/**
 * Efficiency at a part load, the same model read as a ratio.
 *
 * @param split loss split [kW]; @param speedFraction s [-]; @param torqueFraction t [-]
 * @returns η = P_out / (P_out + losses) [-], with P_out = P_N·s·t; 0 when the output is 0.
 */
export function partLoadEfficiency(split: LossSplit, speedFraction: number, torqueFraction: number): number {
  const outputKw = split.ratedPowerKw * speedFraction * torqueFraction;
  if (outputKw <= 0) return 0;
  return outputKw / (outputKw + machineLossKw(split, speedFraction, torqueFraction));
}

/**
 * Efficiency after rewinds.
 *
 * @param efficiency rated efficiency before any rewind [-]
 * @param rewinds number of recorded rewinds [-], ≥ 0
 * @param penaltyPctPoints efficiency lost per rewind [percentage points], default REWIND_PENALTY_PCT_POINTS
 * @returns η − rewinds·penalty/100 [-], never below half the original (a guard, not a model).
 */
export function rewoundEfficiency(efficiency: number, rewinds: number, penaltyPctPoints: number = REWIND_PENALTY_PCT_POINTS): number {
  requireNonNegative('rewinds', rewinds);
  requireInRange('rewindPenaltyPctPoints', penaltyPctPoints, 0, 10);
  return Math.max(efficiency - (rewinds * penaltyPctPoints) / 100, efficiency / 2);
}

/**
 * Reactive power of an induction motor on the line at a part load.
 *
 * @param fullLoadReactiveKvar Q_FL = P_in,FL·tan(acos PF_N) [kvar]
 * @param speedFraction s [-] (1 on the line; V/f control scales both terms with frequency)
 * @param torqueFraction t [-]
 * @param magnetisingShare m [-], default INDUCTION_MAGNETISING_REACTIVE_SHARE
 * @returns Q = Q_FL·s·(m + (1 − m)·t²) [kvar]: magnetising reactive power constant, leakage ∝ I².
 * References: equivalent circuit of the induction motor (magnetising and leakage reactances);
 * the share is fitted to [3].
 */
export function inductionReactiveKvar(
  fullLoadReactiveKvar: number,
  speedFraction: number,
  torqueFraction: number,
  magnetisingShare: number = INDUCTION_MAGNETISING_REACTIVE_SHARE,
): number {
  return fullLoadReactiveKvar * speedFraction * (magnetisingShare + (1 - magnetisingShare) * torqueFraction * torqueFraction);
}

/**
 * Typical rated power factor of a cage induction motor when the nameplate does not give one.
 *
 * @param ratedPowerKw [kW]; @param poles [-]
 * @returns PF_N [-]: 4-pole 0.72 at 0.37 kW rising to 0.87 at 100 kW and above (linear in log P),
 *   2 poles +0.02, 6 poles −0.04, 8 poles −0.08 (common practice, values from memory).
 */
export function typicalRatedPowerFactor(ratedPowerKw: number, poles: number): number {
  const x = Math.min(Math.max(Math.log10(ratedPowerKw / 0.37) / Math.log10(100 / 0.37), 0), 1);
  const fourPole = 0.72 + (0.87 - 0.72) * x;
  const poleShift = poles === 2 ? 0.02 : poles === 6 ? -0.04 : poles === 8 ? -0.08 : 0;
  return Math.round((fourPole + poleShift) * 1000) / 1000;
}
