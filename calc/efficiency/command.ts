/**
 * `efficiency-class`: the nominal efficiency of a class for a rating, with its source.
 */
import { z } from 'zod';
import { parseInput } from '../input.js';
import { CalcInputError } from '../errors.js';
import { iecClassEfficiency, nemaNominalEfficiencyPct, unknownClassEfficiency, type ClassEfficiency } from './classes.js';

/** kW per mechanical horsepower [kW/hp] (1 hp = 745.7 W). */
export const KW_PER_HP = 0.7457;

export const efficiencyClassInputSchema = z
  .object({
    ratedPowerKw: z.number({ error: 'must be a number' }).positive({ error: 'must be positive' }).optional(),
    ratedPowerHp: z.number({ error: 'must be a number' }).positive({ error: 'must be positive' }).optional(),
    poles: z.union([z.literal(2), z.literal(4), z.literal(6), z.literal(8)], { error: 'must be 2, 4, 6 or 8' }),
    frequencyHz: z.union([z.literal(50), z.literal(60)], { error: 'must be 50 or 60' }),
    efficiencyClass: z.enum(['IE1', 'IE2', 'IE3', 'IE4', 'IE5', 'unknown', 'nema-premium', 'epact'], {
      error: 'must be one of IE1, IE2, IE3, IE4, IE5, unknown, nema-premium, epact',
    }),
    enclosure: z.enum(['enclosed', 'open'], { error: 'must be enclosed or open' }).optional(),
  })
  .refine((input) => input.ratedPowerKw !== undefined || input.ratedPowerHp !== undefined, {
    error: 'or ratedPowerHp is required',
    path: ['ratedPowerKw'],
  });

/**
 * Runs `efficiency-class`.
 *
 * @param input {ratedPowerKw [kW] | ratedPowerHp [hp], poles, frequencyHz [Hz], efficiencyClass:
 *   'IE1'…'IE5' | 'unknown' | 'nema-premium' | 'epact', enclosure?}
 * @returns {efficiencyPct [%], source}; the NEMA levels need 60 Hz and use hp (from kW/0.7457 when
 *   only kW is given).
 */
export function runEfficiencyClassCommand(input: unknown): ClassEfficiency {
  const parsed = parseInput(efficiencyClassInputSchema, input);
  if (parsed.efficiencyClass === 'nema-premium' || parsed.efficiencyClass === 'epact') {
    if (parsed.frequencyHz !== 60) throw new CalcInputError('frequencyHz', `must be 60 for ${parsed.efficiencyClass}`);
    const hp = parsed.ratedPowerHp ?? (parsed.ratedPowerKw ?? 0) / KW_PER_HP;
    return nemaNominalEfficiencyPct(hp, parsed.poles, parsed.enclosure ?? 'enclosed', parsed.efficiencyClass);
  }
  const kw = parsed.ratedPowerKw ?? (parsed.ratedPowerHp ?? 0) * KW_PER_HP;
  if (parsed.efficiencyClass === 'unknown') return unknownClassEfficiency(kw, parsed.poles, parsed.frequencyHz);
  return iecClassEfficiency(kw, parsed.poles, parsed.frequencyHz, parsed.efficiencyClass);
}
