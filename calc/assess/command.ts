/**
 * `assess`: one motor against every retrofit option (calc/assess/assess.ts).
 */
import { parseInput } from '../input.js';
import { assess, type AssessResult } from './assess.js';
import { assessInputSchema } from './schema.js';

/**
 * Runs `assess`.
 *
 * @param input {motor, site, priceBook?, assumptions?} validated by assessInputSchema
 * @returns the AssessResult (baseline, options, recommended, assumptions).
 */
export function runAssessCommand(input: unknown): AssessResult {
  const parsed = parseInput(assessInputSchema, input);
  return assess(parsed.motor, parsed.site, parsed.priceBook, parsed.assumptions);
}
