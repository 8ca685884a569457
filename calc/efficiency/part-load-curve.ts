/**
 * Reading a part-load curve (calc/contracts.ts PartLoadCurve): the measured or computed efficiency
 * and supply power factor of a whole option (motor and drive) versus shaft load.
 */
import type { PartLoadCurve } from '../contracts.js';
import { CalcInputError } from '../errors.js';

/** Efficiency and power factor read from a curve. */
export interface CurveReading {
  efficiency: number;
  powerFactor: number;
}

/**
 * Checks a curve once before it is read many times.
 *
 * @param curve the curve; @param field the dotted field to name in an error (e.g. "motor.bldcCurve")
 * @throws CalcInputError when it has fewer than two points, unsorted loads, or an efficiency or
 *   power factor outside (0, 1].
 */
export function checkPartLoadCurve(curve: PartLoadCurve, field: string): void {
  if (!(curve.ratedPowerKw > 0)) throw new CalcInputError(`${field}.ratedPowerKw`, 'must be positive');
  if (curve.points.length < 2) throw new CalcInputError(`${field}.points`, 'needs at least two points');
  curve.points.forEach((point, index) => {
    if (index > 0 && !(point.loadFraction > curve.points[index - 1]!.loadFraction)) {
      throw new CalcInputError(`${field}.points`, 'must be sorted by loadFraction, strictly increasing');
    }
    if (!(point.efficiency > 0 && point.efficiency < 1)) throw new CalcInputError(`${field}.points.${index}.efficiency`, 'must be between 0 and 1');
    if (!(point.powerFactor > 0 && point.powerFactor <= 1)) throw new CalcInputError(`${field}.points.${index}.powerFactor`, 'must be between 0 and 1');
  });
}

/**
 * Efficiency and power factor at a load, by linear interpolation in load.
 *
 * @param curve a checked curve; @param loadFraction shaft load / curve.ratedPowerKw [-]
 * @returns the interpolated reading [-]; outside the curve's range the end point is held.
 */
export function readPartLoadCurve(curve: PartLoadCurve, loadFraction: number): CurveReading {
  const points = curve.points;
  const first = points[0]!;
  if (loadFraction <= first.loadFraction) return { efficiency: first.efficiency, powerFactor: first.powerFactor };
  for (let index = 1; index < points.length; index += 1) {
    const upper = points[index]!;
    if (loadFraction <= upper.loadFraction) {
      const lower = points[index - 1]!;
      const weight = (loadFraction - lower.loadFraction) / (upper.loadFraction - lower.loadFraction);
      return {
        efficiency: lower.efficiency + weight * (upper.efficiency - lower.efficiency),
        powerFactor: lower.powerFactor + weight * (upper.powerFactor - lower.powerFactor),
      };
    }
  }
  const last = points[points.length - 1]!;
  return { efficiency: last.efficiency, powerFactor: last.powerFactor };
}
