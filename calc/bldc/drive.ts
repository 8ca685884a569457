/**
 * The drive (inverter with a diode front end): its losses by the three-term model and the power
 * factor it presents to the supply.
 *
 * References:
 * [1] IEC 61800-9-2:2017, relative losses of power drive systems and their dependence on current
 *     (the loss grows with a fixed, a current-proportional and a current-squared part).
 * [2] N. Mohan, T. Undeland, W. Robbins, Power Electronics, 3rd ed., 2003, ch. 5 (six-pulse diode
 *     rectifier: displacement factor near 1, distortion of the line current).
 */
import type { DriveLossModel } from '../contracts.js';

/** Control, gate drive and cooling fan: fixed part [W] + share of rated power (common practice, no source). */
export const DRIVE_FIXED_LOSS_W = 10;
export const DRIVE_FIXED_LOSS_FRACTION = 0.003;
/** Threshold voltage of one conducting path (IGBT or diode plus the rectifier's share) [V] (common practice, no source). */
export const DRIVE_THRESHOLD_V = 1.6;
/** Switching frequency [Hz] (common practice, no source). */
export const DRIVE_SWITCHING_FREQUENCY_HZ = 8000;
/** Switching energy (on + off) per ampere and per volt switched [J/(A·V)] (common practice, no source). */
export const DRIVE_SWITCHING_ENERGY_J_PER_AV = 1.67e-7;
/** On-state voltage of the resistive part at rated current [V] (common practice, no source). */
export const DRIVE_RESISTIVE_DROP_AT_RATED_V = 0.5;
/** Displacement factor of a diode front end [-] (Mohan et al. [2], ch. 5; ≈ 0.98, common practice). */
export const DRIVE_DISPLACEMENT_FACTOR = 0.98;
/** Line-current THD of a six-pulse rectifier with DC choke at rated load [-] (common practice: 35–45 %). */
export const DRIVE_RATED_CURRENT_THD = 0.4;
/** Highest line-current THD at very light load [-] (common practice, no source). */
export const DRIVE_MAX_CURRENT_THD = 1.5;

/**
 * Loss coefficients of the drive that feeds a motor of this rating.
 * Fixed: DRIVE_FIXED_LOSS_W + DRIVE_FIXED_LOSS_FRACTION·P_rated; per RMS ampere: three phases ×
 * mean/RMS ratio 2√2/π × (threshold drop + switching energy·f_sw·V_dc); per ampere²: three phases ×
 * on-state resistance DRIVE_RESISTIVE_DROP_AT_RATED_V / I_rated. The form follows [1].
 * @param ratedPowerW rated shaft power [W]
 * @param ratedCurrentA rated RMS motor current [A]
 * @param dcBusV DC bus voltage [V]
 * @returns the three coefficients [W], [W/A], [Ω]
 */
export function driveLossModel(ratedPowerW: number, ratedCurrentA: number, dcBusV: number): DriveLossModel {
  const meanToRms = (2 * Math.SQRT2) / Math.PI;
  return {
    fixedW: DRIVE_FIXED_LOSS_W + DRIVE_FIXED_LOSS_FRACTION * ratedPowerW,
    perAmpereW: 3 * meanToRms * (DRIVE_THRESHOLD_V + DRIVE_SWITCHING_ENERGY_J_PER_AV * DRIVE_SWITCHING_FREQUENCY_HZ * dcBusV),
    perAmpereSquaredOhm: (3 * DRIVE_RESISTIVE_DROP_AT_RATED_V) / Math.max(ratedCurrentA, 1e-6),
  };
}

/**
 * Drive loss at a motor current: P = fixed + perAmpere·I + perAmpereSquared·I² [W] ([1]).
 * @param model loss coefficients
 * @param currentA RMS motor current [A]
 */
export function driveLossW(model: DriveLossModel, currentA: number): number {
  return model.fixedW + model.perAmpereW * currentA + model.perAmpereSquaredOhm * currentA * currentA;
}

/**
 * Power factor of the drive's input: displacement × distortion, distortion = 1/√(1 + THD²),
 * THD rising at light load as THD_rated/√(load) up to DRIVE_MAX_CURRENT_THD (common practice, no source; [2]).
 * @param loadFraction input power as a fraction of rated [-]
 * @returns power factor [-]
 */
export function driveInputPowerFactor(loadFraction: number): number {
  const thd = Math.min(DRIVE_MAX_CURRENT_THD, DRIVE_RATED_CURRENT_THD / Math.sqrt(Math.max(loadFraction, 1e-3)));
  return DRIVE_DISPLACEMENT_FACTOR / Math.sqrt(1 + thd * thd);
}
