/**
 * Losses and input power factor of a variable-speed drive (a complete drive module, CDM).
 *
 * References:
 * [1] IEC 61800-9-2:2017, Adjustable speed electrical power drive systems – Ecodesign: IE classes
 *     of the CDM relative to a reference CDM (IE2 below 75 %, IE1 75–125 %, IE0 above 125 % of the
 *     reference losses; class boundaries from memory). The reference losses themselves were not at
 *     hand: DRIVE_REFERENCE_LOSS_FRACTION below is common practice, no source.
 * [2] IEEE Std 519 and drive application guides: input current distortion of a six-pulse diode
 *     rectifier with a DC choke (THD_I about 35–45 % at full load), common practice.
 */
import { requireInRange, requirePositive } from '../errors.js';

export type DriveClass = 'IE0' | 'IE1' | 'IE2';

/**
 * Losses of the class relative to the reference CDM [-] ([1]; a value inside each class band).
 */
export const DRIVE_CLASS_LOSS_FACTOR: Readonly<Record<DriveClass, number>> = { IE0: 1.4, IE1: 1.0, IE2: 0.7 };

/**
 * Full-load losses of a reference (IE1) drive as a fraction of its rated output [-]:
 * 2.5 % + 3.5 %/√(P/1 kW), about 6.5 % at 0.75 kW, 3.8 % at 7.5 kW, 2.9 % at 75 kW (common practice, no source).
 */
export function driveReferenceLossFraction(ratedPowerKw: number): number {
  requirePositive('ratedPowerKw', ratedPowerKw);
  return 0.025 + 0.035 / Math.sqrt(ratedPowerKw);
}

/**
 * Shares of the full-load drive losses that are fixed (control, fan), proportional to current
 * (threshold voltages of the semiconductors, switching) and to its square (on-state resistance) [-]
 * (the usual three-term model, see calc/contracts.ts DriveLossModel; shares common practice, no source).
 */
export const DRIVE_LOSS_SHARES = { fixed: 0.2, perCurrent: 0.5, perCurrentSquared: 0.3 } as const;

/** Displacement power factor of a diode front end [-] (common practice, [2]). */
export const DRIVE_DISPLACEMENT_POWER_FACTOR = 0.97;
/** Input current THD at full load of a six-pulse drive with DC choke [-] ([2], common practice). */
export const DRIVE_FULL_LOAD_CURRENT_THD = 0.4;

/**
 * Drive losses at a part load.
 *
 * @param ratedPowerKw rated output of the drive (= rated power of its motor) [kW]
 * @param currentFraction motor current / rated current c [-], 0–1.25
 * @param driveClass 'IE0' | 'IE1' | 'IE2' per IEC 61800-9-2
 * @returns P_d = P_N·f_ref(P_N)·k_class·(a + b·c + d·c²) [kW], a + b + d = 1 (DRIVE_LOSS_SHARES).
 * References: [1] (classes), three-term loss model (common practice).
 */
export function driveLossKw(ratedPowerKw: number, currentFraction: number, driveClass: DriveClass): number {
  return driveLossFromFullLoadKw(driveFullLoadLossKw(ratedPowerKw, driveClass), currentFraction);
}

/** Full-load losses of a drive, P_N·f_ref(P_N)·k_class [kW] (see driveLossKw). */
export function driveFullLoadLossKw(ratedPowerKw: number, driveClass: DriveClass): number {
  return ratedPowerKw * driveReferenceLossFraction(ratedPowerKw) * DRIVE_CLASS_LOSS_FACTOR[driveClass];
}

/**
 * Drive losses at a part load from its full-load losses (the part driveLossKw repeats per bin).
 *
 * @param fullLoadLossKw [kW]; @param currentFraction c [-]
 * @returns P_FL·(a + b·c + d·c²) [kW].
 */
export function driveLossFromFullLoadKw(fullLoadLossKw: number, currentFraction: number): number {
  const c = currentFraction;
  return fullLoadLossKw * (DRIVE_LOSS_SHARES.fixed + DRIVE_LOSS_SHARES.perCurrent * c + DRIVE_LOSS_SHARES.perCurrentSquared * c * c);
}

/**
 * Power factor the supply sees at a drive's input.
 *
 * @param outputFraction drive output / rated output [-], 0–1.25
 * @returns PF = cos φ1 · 1/√(1 + THD²) [-], with THD = THD_FL/√max(x, 0.1) (distortion grows at
 *   light load); displacement × distortion factor.
 * References: [2]; definition of the true power factor for non-sinusoidal current.
 */
export function driveInputPowerFactor(outputFraction: number): number {
  if (!(outputFraction >= 0 && outputFraction <= 1.5)) requireInRange('outputFraction', outputFraction, 0, 1.5);
  const thd = DRIVE_FULL_LOAD_CURRENT_THD / Math.sqrt(Math.max(outputFraction, 0.1));
  return DRIVE_DISPLACEMENT_POWER_FACTOR / Math.sqrt(1 + thd * thd);
}
