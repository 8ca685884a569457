/**
 * Money arithmetic. Amounts are numbers in the site's currency.
 *
 * Measured choice (see calc/README.md, "Money"): decimal.js costs about 2 µs to build a Decimal from a
 * float and 1–1.5 µs to round one back, i.e. 300–500 µs for the ~100 money figures of one motor's
 * assessment, against a budget of 20 µs per motor. So inside one motor's assessment money is computed
 * in binary floating point (each figure is a sum or product of fewer than 50 terms below 1e9, whose
 * rounding error stays below 1e-6 of a cent) and rounded once, at the end, to cents by `roundMoney`;
 * a test recomputes every money figure of random motors in decimal.js and finds them equal to the cent.
 * Totals over many motors (a site, a business case) are added in decimal.js by `sumMoney` and rounded
 * once.
 */
import { Decimal } from 'decimal.js';

/** Decimals of the currency's minor unit (cents) [-]. */
export const MONEY_DECIMALS = 2;

/**
 * Rounds an amount to cents, half away from zero.
 *
 * @param amount [currency]
 * @returns amount rounded to MONEY_DECIMALS decimals [currency]; the tiny relative nudge removes
 *   binary representation error (2.675 is stored as 2.67499999…) before rounding.
 */
export function roundMoney(amount: number): number {
  if (!Number.isFinite(amount)) return amount;
  const scaled = Math.abs(amount) * 100;
  const rounded = Math.round(scaled * (1 + 4 * Number.EPSILON)) / 100;
  return amount < 0 ? -rounded : rounded;
}

/**
 * Adds amounts exactly in decimal and rounds once.
 *
 * @param amounts [currency]
 * @param decimals decimals of the result [-], default MONEY_DECIMALS
 * @returns Σ amounts rounded half away from zero [currency] (decimal.js ROUND_HALF_UP on the exact sum).
 */
export function sumMoney(amounts: readonly number[], decimals: number = MONEY_DECIMALS): number {
  let total = new Decimal(0);
  for (const amount of amounts) total = total.plus(amount);
  return total.toDecimalPlaces(decimals, Decimal.ROUND_HALF_UP).toNumber();
}
