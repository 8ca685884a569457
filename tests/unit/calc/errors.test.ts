import { describe, expect, it } from 'vitest';
import { CalcInputError, requireInRange, requirePositive } from '../../../calc/errors.js';

describe('calc input errors', () => {
  it('names the argument and the rule', () => {
    expect(() => requirePositive('ratedPowerKw', -1)).toThrow('"ratedPowerKw" must be positive');
    expect(() => requireInRange('loadFraction', 2, 0, 1.25)).toThrow('"loadFraction" must be between 0 and 1.25');
  });

  it('keeps the field for callers that point the user at it', () => {
    try {
      requirePositive('voltageV', 0);
    } catch (error) {
      expect(error).toBeInstanceOf(CalcInputError);
      expect((error as CalcInputError).field).toBe('voltageV');
    }
    expect.assertions(2);
  });
});
