/**
 * The one error kind of calc/: an input that breaks a rule. `field` names the argument (a dotted
 * path for nested inputs, e.g. "motor.ratedPowerKw") so a caller can point the user at it.
 */
export class CalcInputError extends Error {
  readonly field: string;

  constructor(field: string, rule: string) {
    super(`"${field}" ${rule}`);
    this.name = 'CalcInputError';
    this.field = field;
  }
}

/** Throws unless `value` is a finite number greater than zero. */
export function requirePositive(field: string, value: number): void {
  if (!Number.isFinite(value) || value <= 0) throw new CalcInputError(field, 'must be positive');
}

/** Throws unless `value` is a finite number at or above zero. */
export function requireNonNegative(field: string, value: number): void {
  if (!Number.isFinite(value) || value < 0) throw new CalcInputError(field, 'must be zero or more');
}

/** Throws unless `value` is a finite number within [min, max]. */
export function requireInRange(field: string, value: number, min: number, max: number): void {
  if (!Number.isFinite(value) || value < min || value > max) {
    throw new CalcInputError(field, `must be between ${min} and ${max}`);
  }
}
