import type { z } from 'zod';
import { CalcInputError } from './errors.js';

/**
 * Validates a command's JSON input against its zod schema; the first issue becomes a
 * CalcInputError naming the dotted path of the offending field.
 */
export function parseInput<Schema extends z.ZodType>(schema: Schema, input: unknown): z.infer<Schema> {
  const result = schema.safeParse(input);
  if (result.success) return result.data;
  const issue = result.error.issues[0];
  const field = issue ? issue.path.map(String).join('.') : '';
  throw new CalcInputError(field, issue ? issue.message : 'is invalid');
}
