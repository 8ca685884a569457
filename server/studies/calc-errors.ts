/**
 * calc/ reports bad input as CalcInputError(field, rule) with the message `"field" rule`; the API
 * answers 400 with `field: rule` like any other validation error, so the client shows the same words.
 */
import { CalcInputError } from '../../calc/errors.js';
import { badRequest } from '../lib/errors.js';

/** The 400 AppError for a CalcInputError, the field prefixed by `prefix` (e.g. `base.`). */
export function calcInputToAppError(error: CalcInputError, prefix = '') {
  const rule = error.message.replace(/^"[^"]*" /, '');
  const field = `${prefix}${error.field}`;
  return badRequest(`${field}: ${rule}`, [{ field, message: rule }]);
}

/** Runs calc work; a CalcInputError becomes a 400 naming the field, anything else passes through. */
export function withCalcErrors<T>(work: () => T, prefix = ''): T {
  try {
    return work();
  } catch (error) {
    if (error instanceof CalcInputError) throw calcInputToAppError(error, prefix);
    throw error;
  }
}
