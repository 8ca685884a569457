/**
 * Six-step (120° conduction) inverter: Hall-sensor commutation table, leg states with the
 * freewheeling diodes, and the terminal voltage each leg applies.
 *
 * References:
 * [1] P. Pillay, R. Krishnan, IEEE Trans. Industry Applications 25(2), 1989, 274–279 (inverter
 *     modes during commutation, Table I).
 * [2] D. Hanselman, Brushless Permanent Magnet Motor Design, 2nd ed., 2006, ch. 7 (six-step
 *     commutation from Hall sensors).
 * [3] R. Krishnan, Electric Motor Drives, 2001, §9.3 (PWM of the upper device, freewheeling).
 */

/** Leg modes. A switch fixes the terminal voltage whatever the current's sign (switch or its own diode). */
export const LEG_HIGH = 0;
export const LEG_LOW = 1;
/** Both switches off, current > 0 flowing through the lower diode: terminal at the negative rail. */
export const LEG_DIODE_LOW = 2;
/** Both switches off, current < 0 flowing through the upper diode: terminal at the positive rail. */
export const LEG_DIODE_HIGH = 3;
/** Both switches off and no current: the phase floats. */
export const LEG_OPEN = 4;

/**
 * Conducting pair per Hall sector: sector s spans electrical angles 30° + 60°·s to 90° + 60°·s,
 * where phase a's back-EMF flat top is 30°–150°. Sequence a+b−, a+c−, b+c−, b+a−, c+a−, c+b−, so
 * each phase is switched to the positive rail for 120° and to the negative rail for 120° ([2] Table 7.1).
 */
export const SECTOR_HIGH_LEG: readonly number[] = [0, 0, 1, 1, 2, 2];
export const SECTOR_LOW_LEG: readonly number[] = [1, 2, 2, 0, 0, 1];

/** Electrical angle of the first Hall boundary [rad]: the start of sector 0 (30°). */
export const FIRST_BOUNDARY_RAD = Math.PI / 6;
/** Width of one Hall sector [rad electrical]. */
export const SECTOR_RAD = Math.PI / 3;

/**
 * Hall sector of an electrical angle.
 * @param electricalAngleRad p·θ [rad], any value
 * @returns sector 0…5
 */
export function hallSector(electricalAngleRad: number): number {
  const index = Math.floor((electricalAngleRad - FIRST_BOUNDARY_RAD) / SECTOR_RAD);
  return ((index % 6) + 6) % 6;
}

/**
 * Unwrapped index of the Hall sector, so that its boundaries are FIRST_BOUNDARY_RAD + SECTOR_RAD·m and
 * FIRST_BOUNDARY_RAD + SECTOR_RAD·(m + 1).
 * @param electricalAngleRad p·θ [rad]
 */
export function sectorCount(electricalAngleRad: number): number {
  return Math.floor((electricalAngleRad - FIRST_BOUNDARY_RAD) / SECTOR_RAD);
}

/**
 * Mode of a leg whose switches are both off, from the sign of its current ([1] Table I).
 * @param currentA phase current, positive into the motor [A]
 */
export function offLegMode(currentA: number): number {
  if (currentA > 0) return LEG_DIODE_LOW;
  if (currentA < 0) return LEG_DIODE_HIGH;
  return LEG_OPEN;
}

/**
 * Terminal voltage of a leg as a multiple of the DC-link voltage [-].
 * @param mode leg mode
 * @param highFactor what a leg in LEG_HIGH applies: the duty (averaged PWM) or 1 (switch on)
 */
export function legFactor(mode: number, highFactor: number): number {
  if (mode === LEG_HIGH) return highFactor;
  if (mode === LEG_DIODE_HIGH) return 1;
  return 0;
}
