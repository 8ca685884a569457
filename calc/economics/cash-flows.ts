/**
 * Engineering economics of a retrofit: cash flows, net present value, internal rate of return,
 * simple and discounted payback, capital recovery factor and life-cycle cost.
 *
 * Rates are fractions per year ([-], 0.08 = 8 %/a). Cash flows are end-of-year amounts in the
 * site's currency, index t = 0 at the investment (not discounted), t = 1…N after it.
 *
 * References:
 * [1] W. G. Sullivan, E. M. Wicks, C. P. Koelling, Engineering Economy, 16th ed., Pearson, 2015:
 *     present worth (Ch. 5), internal rate of return (Ch. 5), discounted payback (Ch. 5),
 *     capital recovery factor (Ch. 4), geometric-gradient series (Ch. 4).
 * [2] numpy-financial documentation: irr([−250000, 100000, 150000, 200000, 250000, 300000]) =
 *     0.5672303344358536 (REFERENCES.md section 8).
 */
import { CalcInputError, requireInRange, requireNonNegative } from '../errors.js';

/** Iteration guard of the IRR search: it throws rather than loop on (never reached on sane input). */
export const IRR_MAX_ITERATIONS = 200;
/** Rates the IRR search brackets [-]: −99 % to 1,000,000 %/a. */
const IRR_LOWER = -0.99;
const IRR_UPPER_LIMIT = 1e4;

/**
 * Cash flows of an investment that saves an escalating amount each year.
 *
 * @param capex investment at t = 0 [currency], ≥ 0
 * @param annualSavings saving in the first year [currency/a] (may be negative)
 * @param years life N [a], integer 1–100
 * @param escalation yearly growth of the saving g [-] (energy-price escalation)
 * @returns [−capex, S, S·(1+g), …, S·(1+g)^(N−1)] [currency] (geometric gradient [1] Ch. 4).
 */
export function savingsCashFlows(capex: number, annualSavings: number, years: number, escalation: number): number[] {
  requireNonNegative('capex', capex);
  if (!Number.isInteger(years) || years < 1 || years > 100) throw new CalcInputError('years', 'must be a whole number from 1 to 100');
  requireInRange('escalation', escalation, -0.5, 1);
  const flows = new Array<number>(years + 1);
  flows[0] = -capex;
  let amount = annualSavings;
  for (let t = 1; t <= years; t += 1) {
    flows[t] = amount;
    amount *= 1 + escalation;
  }
  return flows;
}

/**
 * The checks of `savingsCashFlows` on its inputs, for the functions below that use the series
 * without building it.
 *
 * @param capex [currency], ≥ 0; @param years N [a], integer 1–100; @param escalation g [-], −0.5 to 1
 * @throws CalcInputError naming "capex", "years" or "escalation".
 */
export function checkSavingsCashFlows(capex: number, years: number, escalation: number): void {
  requireNonNegative('capex', capex);
  if (!Number.isInteger(years) || years < 1 || years > 100) throw new CalcInputError('years', 'must be a whole number from 1 to 100');
  requireInRange('escalation', escalation, -0.5, 1);
}

/** Scratch buffers by length for `fillSavingsCashFlows` (module scratch, reused, never returned to a caller's result). */
const scratchFlows: Float64Array[] = [];

/**
 * The cash flows of `savingsCashFlows` written into a reused buffer instead of a new array, for the
 * year-by-year fallbacks of the closed forms below: same values, bit for bit; the buffer is
 * overwritten by the next call, so it stays private to this module.
 *
 * @param capex [currency], ≥ 0; @param annualSavings first-year saving [currency/a]
 * @param years N [a], integer 1–100; @param escalation g [-]
 * @returns a Float64Array of length N + 1 holding [−capex, S, S·(1+g), …] [currency], valid until the next call.
 */
function fillSavingsCashFlows(capex: number, annualSavings: number, years: number, escalation: number): Float64Array {
  checkSavingsCashFlows(capex, years, escalation);
  let flows = scratchFlows[years];
  if (flows === undefined) {
    flows = new Float64Array(years + 1);
    scratchFlows[years] = flows;
  }
  flows[0] = -capex;
  let amount = annualSavings;
  for (let t = 1; t <= years; t += 1) {
    flows[t] = amount;
    amount *= 1 + escalation;
  }
  return flows;
}

/**
 * Net present value.
 *
 * @param rate discount rate i [-], > −1
 * @param cashFlows CF_0…CF_N [currency]
 * @returns NPV = Σ_{t=0..N} CF_t/(1+i)^t [currency] (CF_0 not discounted; [1] Ch. 5; same
 *   convention as numpy-financial's npv).
 */
export function netPresentValue(rate: number, cashFlows: ArrayLike<number>): number {
  if (!(rate > -1)) throw new CalcInputError('discountRate', 'must be above -100 %');
  const factor = 1 / (1 + rate);
  let discount = 1;
  let sum = 0;
  for (let t = 0; t < cashFlows.length; t += 1) {
    sum += cashFlows[t]! * discount;
    discount *= factor;
  }
  return sum;
}

/** Derivative dNPV/di of the last `npvWithSlope` call (module scratch, so the hot loop allocates nothing). */
let lastSlope = 0;

/** NPV at one rate; its derivative dNPV/di is left in `lastSlope`, for Newton steps. */
function npvWithSlope(rate: number, cashFlows: ArrayLike<number>): number {
  const factor = 1 / (1 + rate);
  let discount = 1;
  let value = 0;
  let slope = 0;
  for (let t = 0; t < cashFlows.length; t += 1) {
    const flow = cashFlows[t]!;
    value += flow * discount;
    slope -= t * flow * discount * factor;
    discount *= factor;
  }
  lastSlope = slope;
  return value;
}

/**
 * Internal rate of return: the rate at which NPV = 0.
 *
 * @param cashFlows CF_0…CF_N [currency]
 * @returns i with Σ CF_t/(1+i)^t = 0 [-], or null when NPV does not change sign between −99 %/a and
 *   1,000,000 %/a (no investment, or it never pays back). For conventional flows (one sign change)
 *   the root is unique; otherwise the lowest root above −99 % in the bracket found is returned.
 *   Newton steps kept inside a shrinking bracket (safeguarded Newton), tolerance 1e-12.
 * References: [1] Ch. 5; checked against [2].
 */
export function internalRateOfReturn(cashFlows: ArrayLike<number>): number | null {
  const tolerance = 1e-12 * Math.max(1, Math.abs(cashFlows[0] ?? 1));
  // Fast path: plain Newton from the first-year return; NPV of a conventional investment is convex
  // and decreasing in the rate, so this converges in a few steps. Anything odd falls to the bracket.
  const first = cashFlows[0] ?? 0;
  let guess = first < 0 && (cashFlows[1] ?? 0) > 0 ? Math.min((cashFlows[1] ?? 0) / -first, 10) : 0.1;
  for (let step = 0; step < 30; step += 1) {
    const value = npvWithSlope(guess, cashFlows);
    if (Math.abs(value) < tolerance) return guess;
    if (!(lastSlope < 0)) break;
    const next = guess - value / lastSlope;
    if (!(next > IRR_LOWER) || !Number.isFinite(next)) break;
    if (Math.abs(next - guess) < 1e-15 * Math.max(1, Math.abs(guess))) return next;
    guess = next;
  }
  return bracketedRate(cashFlows, tolerance);
}

/** Safeguarded Newton inside a bracket of NPV sign change; null when there is none. */
function bracketedRate(cashFlows: ArrayLike<number>, tolerance: number): number | null {
  let low = IRR_LOWER;
  let lowValue = npvWithSlope(low, cashFlows);
  let high = 0.1;
  let highValue = npvWithSlope(high, cashFlows);
  // Widen the upper end until NPV changes sign, or give up: no root.
  while (Math.sign(highValue) === Math.sign(lowValue)) {
    if (high >= IRR_UPPER_LIMIT || highValue === 0) break;
    high = high * 4 + 1;
    highValue = npvWithSlope(high, cashFlows);
  }
  if (highValue === 0) return high;
  if (lowValue === 0) return low;
  if (Math.sign(highValue) === Math.sign(lowValue)) return null;
  let rate = (low + high) / 2 > 1 ? (low + high) / 2 : 0.1;
  for (let iteration = 0; iteration < IRR_MAX_ITERATIONS; iteration += 1) {
    const value = npvWithSlope(rate, cashFlows);
    const slope = lastSlope;
    if (Math.abs(value) < tolerance) return rate;
    if (Math.sign(value) === Math.sign(lowValue)) {
      low = rate;
      lowValue = value;
    } else {
      high = rate;
    }
    let next = slope !== 0 ? rate - value / slope : Number.NaN;
    if (!(next > low && next < high)) next = (low + high) / 2; // Newton left the bracket: bisect
    if (Math.abs(next - rate) < 1e-12 * Math.max(1, Math.abs(rate))) return next;
    rate = next;
  }
  throw new CalcInputError('cashFlows', `IRR did not converge in ${IRR_MAX_ITERATIONS} iterations`);
}

/**
 * Largest rounding error [currency] the closed-form NPV may carry before it is summed year by year
 * instead: 1e-4 of a cent, so its cents are those of the sum unless the sum lies within about that
 * of a half cent. A fixed gap between the rates is not enough: the error grows with the amount too.
 */
const CLOSED_FORM_MAX_ERROR = 1e-6;
/** Amount [currency] from which NPV is summed year by year (its cents stay those of the sum). */
const ESCALATING_CLOSED_FORM_MAX_AMOUNT = 1e7;

/**
 * Net present value of `savingsCashFlows(capex, annualSavings, N, g)` in closed form (geometric-
 * gradient series, [1] Ch. 4), with the series factor shared by every amount of the same life.
 *
 * @param capex C [currency], ≥ 0; @param annualSavings S, first year [currency/a]
 * @param factor `escalatingSeriesFactor(N, i, g)`; @param escalation g [-] (the factor's)
 * @returns NPV = −C + S·(1 − ((1+g)/(1+i))^N)/(i − g), or −C + N·S/(1+i) when i = g [currency];
 *   equal to `netPresentValue(i, savingsCashFlows(...))` to about 1e-14 of the amounts. Where the
 *   closed form's rounding error may reach CLOSED_FORM_MAX_ERROR (i and g close for the amount: about
 *   4ε·|PV|·(1+i)/|i − g|, or |PV|·|i − g|·N for the limit formula) or the present value reaches
 *   1e7, the year-by-year sum is returned instead, so the result keeps the sum's cents.
 */
export function netPresentValueOfEscalatingSavings(capex: number, annualSavings: number, factor: EscalatingSeriesFactor, escalation: number): number {
  if (!(factor.rate > -1)) throw new CalcInputError('discountRate', 'must be above -100 %');
  const present = presentValueWithFactor(annualSavings, factor);
  const magnitude = Math.abs(present);
  const gap = Math.abs(factor.rateGap);
  // x = (1+g)/(1+i) carries a few ulps that 1 − x^N does not cancel: an error of about
  // 4ε·(1+i)/|i − g| of the present value when the rates are close; the limit formula used for
  // i = g (within 1e-12) is off by about |i − g|·N/2 of it.
  const wellConditioned = factor.equalRates
    ? magnitude * gap * factor.years < CLOSED_FORM_MAX_ERROR
    : 4 * Number.EPSILON * magnitude * (1 + factor.rate) < CLOSED_FORM_MAX_ERROR * gap;
  if (wellConditioned && magnitude < ESCALATING_CLOSED_FORM_MAX_AMOUNT) return -capex + present;
  return netPresentValue(factor.rate, fillSavingsCashFlows(capex, annualSavings, factor.years, escalation));
}

/**
 * Discounted payback of `savingsCashFlows(capex, annualSavings, N, g)` without building the series:
 * the same operations, in the same order, as `discountedPaybackYears(i, savingsCashFlows(...))`, so
 * the result is identical; it stops in the year the investment is paid back.
 *
 * @param rate i [-]; @param capex C [currency], ≥ 0; @param annualSavings S [currency/a]
 * @param years N [a]; @param escalation g [-]
 * @returns years [a], interpolated linearly within the year; 0 when C = 0; null if not within N years.
 *   [1] Ch. 5.
 */
export function discountedPaybackOfEscalatingSavings(rate: number, capex: number, annualSavings: number, years: number, escalation: number): number | null {
  const factor = 1 / (1 + rate);
  let cumulative = -capex;
  if (cumulative >= 0) return 0;
  let discount = 1;
  let amount = annualSavings;
  for (let t = 1; t <= years; t += 1) {
    discount *= factor;
    const present = amount * discount;
    if (cumulative + present >= 0 && present > 0) return t - 1 + -cumulative / present;
    cumulative += present;
    amount *= 1 + escalation;
  }
  return null;
}

/**
 * x^n for a whole n ≥ 1 by repeated squaring (at most 2·log2 n products, within about n·2⁻⁵³ of
 * x^n): Math.pow cost about ten times as much and was the costliest line of the IRR.
 */
function integerPower(x: number, n: number): number {
  let result = 1;
  let base = x;
  let exponent = n;
  while (exponent > 0) {
    if (exponent & 1) result *= base;
    base *= base;
    exponent >>>= 1;
  }
  return result;
}

/**
 * Internal rate of return of `savingsCashFlows(capex, annualSavings, N, g)` by Newton steps on the
 * closed-form NPV: f(r) = −C + S·G(r), G = (1 − x^N)/(r − g), x = (1+g)/(1+r),
 * f'(r) = S·(N·x^N/(1+r) − G)/(r − g) ([1] Ch. 4–5), started at the growing-perpetuity rate
 * r₀ = S/C + g. Same stopping rules as `internalRateOfReturn` (|NPV| < 1e-12·max(1, C), or a step
 * below 1e-15 of the rate), so the root agrees with it to about 1e-13.
 *
 * @param capex C [currency], ≥ 0; @param annualSavings S [currency/a]; @param years N [a]; @param escalation g [-]
 * @returns i [-] with NPV = 0, or null when there is none (as `internalRateOfReturn`). Anything but a
 *   conventional investment (C > 0, S > 0), a step within 1e-4 of g, below −99 % or not converging in
 *   30 steps is handed to `internalRateOfReturn` on the built series.
 */
export function internalRateOfReturnOfEscalatingSavings(capex: number, annualSavings: number, years: number, escalation: number): number | null {
  if (capex > 0 && annualSavings > 0) {
    const tolerance = 1e-12 * Math.max(1, capex);
    const growth = 1 + escalation;
    let rate = Math.min(annualSavings / capex + escalation, 10);
    for (let step = 0; step < 30; step += 1) {
      const gap = rate - escalation;
      if (!(Math.abs(gap) > 1e-4)) break;
      const x = growth / (1 + rate);
      const power = integerPower(x, years);
      const series = (1 - power) / gap;
      const value = annualSavings * series - capex;
      if (Math.abs(value) < tolerance) return rate;
      const slope = (annualSavings * ((years * power) / (1 + rate) - series)) / gap;
      if (!(slope < 0)) break;
      const next = rate - value / slope;
      if (!(next > IRR_LOWER) || !Number.isFinite(next)) break;
      if (Math.abs(next - rate) < 1e-15 * Math.max(1, Math.abs(rate))) return next;
      rate = next;
    }
  }
  return internalRateOfReturn(fillSavingsCashFlows(capex, annualSavings, years, escalation));
}

/**
 * Simple payback.
 *
 * @param capex investment [currency]; @param annualSavings first-year saving [currency/a]
 * @returns capex / saving [a]; 0 when capex is 0 and the saving positive; null when the saving is
 *   zero or negative (never pays back). [1] Ch. 5.
 */
export function simplePaybackYears(capex: number, annualSavings: number): number | null {
  requireNonNegative('capex', capex);
  if (!(annualSavings > 0)) return null;
  return capex / annualSavings;
}

/**
 * Discounted payback: the time when the cumulative discounted cash flow turns non-negative.
 *
 * @param rate discount rate i [-]; @param cashFlows CF_0…CF_N [currency]
 * @returns years [a], interpolated linearly within the year it happens; null if not within N years.
 * References: [1] Ch. 5 (discounted payback period).
 */
export function discountedPaybackYears(rate: number, cashFlows: ArrayLike<number>): number | null {
  const factor = 1 / (1 + rate);
  let cumulative = cashFlows[0] ?? 0;
  if (cumulative >= 0) return 0;
  let discount = 1;
  for (let t = 1; t < cashFlows.length; t += 1) {
    discount *= factor;
    const present = cashFlows[t]! * discount;
    if (cumulative + present >= 0 && present > 0) return t - 1 + -cumulative / present;
    cumulative += present;
  }
  return null;
}

/**
 * Capital recovery factor.
 *
 * @param rate i [-]; @param years N [a]
 * @returns CRF = i(1+i)^N/((1+i)^N − 1) [1/a]; 1/N when i = 0. [1] Ch. 4.
 */
export function capitalRecoveryFactor(rate: number, years: number): number {
  if (!(years > 0)) throw new CalcInputError('years', 'must be positive');
  if (Math.abs(rate) < 1e-12) return 1 / years;
  const growth = (1 + rate) ** years;
  return (rate * growth) / (growth - 1);
}

/**
 * Present value of an amount paid at the end of each year that grows by g a year.
 *
 * @param firstAmount amount in year 1 [currency/a]; @param years N [a]; @param rate i [-]; @param escalation g [-]
 * @returns PV = A·(1 − ((1+g)/(1+i))^N)/(i − g), or N·A/(1+i) when i = g [currency]
 *   (geometric-gradient series present worth, [1] Ch. 4).
 */
export function presentValueOfEscalatingSeries(firstAmount: number, years: number, rate: number, escalation: number): number {
  return presentValueWithFactor(firstAmount, escalatingSeriesFactor(years, rate, escalation));
}

/** The parts of the geometric-gradient present worth that do not depend on the amount. */
export interface EscalatingSeriesFactor {
  years: number;
  rate: number;
  /** True when i = g (the limit formula applies). */
  equalRates: boolean;
  /** 1 − ((1+g)/(1+i))^N [-] (0 when equalRates). */
  growthTerm: number;
  /** i − g [-]. */
  rateGap: number;
}

/**
 * Precomputes the power in `presentValueOfEscalatingSeries`, so many amounts over the same life,
 * rate and escalation share it.
 *
 * @param years N [a]; @param rate i [-]; @param escalation g [-]
 * @returns the factor parts (see EscalatingSeriesFactor). [1] Ch. 4.
 */
export function escalatingSeriesFactor(years: number, rate: number, escalation: number): EscalatingSeriesFactor {
  const equalRates = Math.abs(rate - escalation) < 1e-12;
  return { years, rate, equalRates, growthTerm: equalRates ? 0 : 1 - ((1 + escalation) / (1 + rate)) ** years, rateGap: rate - escalation };
}

/**
 * Present value of an escalating series from a precomputed factor; the same operations, in the same
 * order, as `presentValueOfEscalatingSeries`, so the result is identical.
 *
 * @param firstAmount A [currency/a]; @param factor from `escalatingSeriesFactor`
 * @returns PV [currency]: A·(1 − ((1+g)/(1+i))^N)/(i − g), or N·A/(1+i) when i = g.
 */
export function presentValueWithFactor(firstAmount: number, factor: EscalatingSeriesFactor): number {
  if (factor.equalRates) return (factor.years * firstAmount) / (1 + factor.rate);
  return (firstAmount * factor.growthTerm) / factor.rateGap;
}

/**
 * Life-cycle cost: investment plus the present value of the running cost over the life.
 *
 * @param capex [currency]; @param annualCost first-year running (energy + demand) cost [currency/a]
 * @param years life N [a]; @param rate i [-]; @param escalation g [-]
 * @returns LCC = capex + PV(annualCost, growing by g) [currency]. [1] Ch. 4–5.
 */
export function lifeCycleCost(capex: number, annualCost: number, years: number, rate: number, escalation: number): number {
  return capex + presentValueOfEscalatingSeries(annualCost, years, rate, escalation);
}
