/**
 * `economics`: payback, NPV and IRR of an investment that saves an escalating amount each year, or
 * of any cash-flow series.
 */
import { z } from 'zod';
import { parseInput } from '../input.js';
import { CalcInputError } from '../errors.js';
import { discountedPaybackYears, internalRateOfReturn, netPresentValue, savingsCashFlows, simplePaybackYears } from './cash-flows.js';
import { roundMoney } from './money.js';

export const economicsInputSchema = z.object({
  capex: z.number({ error: 'must be a number' }).min(0, { error: 'must be zero or more' }).optional(),
  annualSavings: z.number({ error: 'must be a number' }).optional(),
  years: z.number({ error: 'must be a number' }).int({ error: 'must be a whole number' }).min(1, { error: 'must be 1 or more' }).max(100, { error: 'must be at most 100' }).optional(),
  discountRatePct: z.number({ error: 'must be a number' }).gt(-100, { error: 'must be above -100' }).max(1000, { error: 'must be at most 1000' }),
  escalationPct: z.number({ error: 'must be a number' }).min(-50, { error: 'must be -50 or more' }).max(100, { error: 'must be at most 100' }).optional(),
  /** Alternative to capex/annualSavings/years: the flows CF_0…CF_N themselves. */
  cashFlows: z.array(z.number({ error: 'must be a number' })).min(2, { error: 'needs at least two values' }).max(101, { error: 'has at most 101 values' }).optional(),
});

export interface EconomicsOutput {
  /** [a]; null when the saving is not positive. */
  simplePaybackYears: number | null;
  /** [a]; null when not within the life. */
  discountedPaybackYears: number | null;
  /** [currency], rounded to cents. */
  npv: number;
  /** [-] (0.25 = 25 %/a); null when none. */
  irr: number | null;
  /** The flows used, CF_0…CF_N [currency]. */
  cashFlows: number[];
}

/**
 * Runs `economics`.
 *
 * @param input {capex [currency], annualSavings [currency/a], years [a], discountRatePct [%/a],
 *   escalationPct [%/a]} or {cashFlows [currency], discountRatePct}
 * @returns simple payback (capex / first-year saving; for given flows, when the undiscounted
 *   cumulative flow turns non-negative) and discounted payback [a], NPV [currency], IRR [-] and the flows.
 */
export function runEconomicsCommand(input: unknown): EconomicsOutput {
  const parsed = parseInput(economicsInputSchema, input);
  const rate = parsed.discountRatePct / 100;
  let flows: number[];
  if (parsed.cashFlows) {
    flows = parsed.cashFlows;
  } else {
    if (parsed.capex === undefined) throw new CalcInputError('capex', 'is required unless cashFlows is given');
    if (parsed.annualSavings === undefined) throw new CalcInputError('annualSavings', 'is required unless cashFlows is given');
    if (parsed.years === undefined) throw new CalcInputError('years', 'is required unless cashFlows is given');
    flows = savingsCashFlows(parsed.capex, parsed.annualSavings, parsed.years, (parsed.escalationPct ?? 0) / 100);
  }
  const capex = Math.max(-(flows[0] ?? 0), 0);
  return {
    // Given flows: the undiscounted payback; otherwise capex / first-year saving.
    simplePaybackYears: parsed.cashFlows ? discountedPaybackYears(0, flows) : simplePaybackYears(capex, flows[1] ?? 0),
    discountedPaybackYears: discountedPaybackYears(rate, flows),
    npv: roundMoney(netPresentValue(rate, flows)),
    irr: internalRateOfReturn(flows),
    cashFlows: flows,
  };
}
