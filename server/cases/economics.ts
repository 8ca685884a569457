/**
 * The economics of a business case as ONE investment: the recommended retrofits' cash flows added
 * year by year (in decimal.js), then calc's NPV, IRR and paybacks applied to the sum. IRRs and
 * paybacks are never added or averaged across motors: they are not additive; NPVs and present values
 * are, which the tests use as a cross-check (case NPV = Σ item NPVs to the cent per item).
 *
 * References: W. G. Sullivan, E. M. Wicks, C. P. Koelling, Engineering Economy, 16th ed., Pearson,
 * 2015, Ch. 4–5 (geometric-gradient series, present worth, IRR, discounted payback), as implemented
 * in calc/economics/cash-flows.ts.
 */
import { Decimal } from 'decimal.js';
import {
  discountedPaybackYears,
  internalRateOfReturn,
  netPresentValue,
  simplePaybackYears,
} from '../../calc/economics/cash-flows.js';
import { roundMoney, sumMoney } from '../../calc/economics/money.js';
import type { CaseCashFlowYear } from '../shared/case.js';

/** One retrofit as an investment: capex at t = 0, then a first-year saving that escalates over its life. */
export interface InvestmentLine {
  /** Net of rebates [currency]. */
  capex: number;
  /** First-year saving [currency/yr]. */
  savingsCost: number;
  /** [yr], whole. */
  lifeYears: number;
}

export interface AggregateEconomics {
  /** CF_0…CF_N of the whole case [currency], each rounded to cents. */
  flows: number[];
  capex: number;
  firstYearSavings: number;
  simplePaybackYears: number | null;
  discountedPaybackYears: number | null;
  npv: number;
  irr: number | null;
  analysisYears: number;
}

const round2OrNull = (value: number | null) => (value === null ? null : Math.round(value * 100) / 100);
const round4OrNull = (value: number | null) => (value === null ? null : Math.round(value * 10000) / 10000);

/** The first-year saving of all lines of one life [currency/yr]. */
export interface LifeSavings {
  lifeYears: number;
  savingsCost: number;
}

/** Σ capex and Σ first-year saving per life of the lines, in decimal.js (sumMoney). */
export function sumLines(lines: readonly InvestmentLine[]): { capex: number; byLife: LifeSavings[] } {
  const savingsByLife = new Map<number, number[]>();
  const capexes = new Array<number>(lines.length);
  for (let index = 0; index < lines.length; index += 1) {
    const line = lines[index]!;
    capexes[index] = line.capex;
    let list = savingsByLife.get(line.lifeYears);
    if (!list) savingsByLife.set(line.lifeYears, (list = []));
    list.push(line.savingsCost);
  }
  return { capex: sumMoney(capexes), byLife: [...savingsByLife].map(([lifeYears, amounts]) => ({ lifeYears, savingsCost: sumMoney(amounts) })) };
}

/**
 * The case's yearly cash flows: CF_0 = −Σ capex; CF_t = Σ_{lives L ≥ t} S_L·(1+g)^(t−1), S_L the
 * first-year saving of the lines of life L. Escalation multiplies every line of a life alike, so
 * applying it to the life's sum gives the per-line sum exactly; the arithmetic is decimal.js.
 *
 * @param capex Σ capex [currency]; @param byLife first-year savings by life [currency/yr, yr]
 * @param escalation yearly growth of the savings g [-] (energy-price escalation)
 * @returns [CF_0, …, CF_N] [currency] rounded to cents, N the longest life; [−capex] with no life.
 */
export function cashFlowsFromSums(capex: number, byLife: readonly LifeSavings[], escalation: number): number[] {
  const lives = byLife.map((entry) => ({ life: entry.lifeYears, amount: new Decimal(entry.savingsCost) }));
  const years = lives.reduce((longest, entry) => Math.max(longest, entry.life), 0);
  const flows = new Array<number>(years + 1);
  flows[0] = capex === 0 ? 0 : -capex;
  const growth = new Decimal(1).plus(escalation);
  let factor = new Decimal(1); // (1+g)^(t−1)
  for (let t = 1; t <= years; t += 1) {
    let flow = new Decimal(0);
    for (const entry of lives) if (entry.life >= t) flow = flow.plus(entry.amount.times(factor));
    flows[t] = flow.toDecimalPlaces(2, Decimal.ROUND_HALF_UP).toNumber();
    factor = factor.times(growth);
  }
  return flows;
}

/** The aggregate cash flows of the lines (see cashFlowsFromSums). */
export function aggregateCashFlows(lines: readonly InvestmentLine[], escalation: number): number[] {
  const { capex, byLife } = sumLines(lines);
  return cashFlowsFromSums(capex, byLife, escalation);
}

/**
 * NPV, IRR and paybacks of the aggregate flows.
 *
 * @param flows CF_0…CF_N of the case [currency]; @param rate discount rate i [-]
 * @returns simple payback = Σ capex / Σ first-year saving [yr]; discounted payback [yr], NPV
 *   = Σ CF_t/(1+i)^t [currency], IRR [-] of the summed flows (calc/economics); N [yr].
 */
export function economicsOfFlows(flows: number[], rate: number): AggregateEconomics {
  const capex = flows[0] === 0 ? 0 : -flows[0]!;
  const firstYearSavings = flows[1] ?? 0;
  const hasInvestment = flows.length > 1;
  return {
    flows,
    capex,
    firstYearSavings,
    simplePaybackYears: hasInvestment ? round2OrNull(simplePaybackYears(capex, firstYearSavings)) : null,
    discountedPaybackYears: hasInvestment ? round2OrNull(discountedPaybackYears(rate, flows)) : null,
    npv: roundMoney(netPresentValue(rate, flows)),
    irr: hasInvestment && capex > 0 && firstYearSavings > 0 ? round4OrNull(internalRateOfReturn(flows)) : null,
    analysisYears: flows.length - 1,
  };
}

/** economicsOfFlows of the lines' aggregate cash flows. */
export function aggregateEconomics(lines: readonly InvestmentLine[], rate: number, escalation: number): AggregateEconomics {
  return economicsOfFlows(aggregateCashFlows(lines, escalation), rate);
}

/**
 * The cumulative cash flow of the case by year, undiscounted and discounted (the payback chart).
 *
 * @param flows CF_0…CF_N [currency]; @param rate i [-]
 * @returns per year t: CF_t, Σ_{k≤t} CF_k, Σ_{k≤t} CF_k/(1+i)^k [currency], rounded to cents.
 */
export function cumulativeCashFlow(flows: readonly number[], rate: number): CaseCashFlowYear[] {
  let cumulative = new Decimal(0);
  let discounted = new Decimal(0);
  const factor = new Decimal(1).dividedBy(new Decimal(1).plus(rate));
  let discount = new Decimal(1);
  return flows.map((flow, year) => {
    cumulative = cumulative.plus(flow);
    discounted = discounted.plus(discount.times(flow));
    discount = discount.times(factor);
    return { year, cashFlow: flow, cumulative: cumulative.toDecimalPlaces(2).toNumber(), discountedCumulative: roundMoney(discounted.toNumber()) };
  });
}
