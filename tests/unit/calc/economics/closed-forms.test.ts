/**
 * The closed-form economics of an escalating savings series (calc/economics/cash-flows.ts:
 * netPresentValueOfEscalatingSavings, discountedPaybackOfEscalatingSavings,
 * internalRateOfReturnOfEscalatingSavings) against the year-by-year functions on the built series
 * and against the `financial` npm package (a port of numpy-financial).
 * [1] W. G. Sullivan, E. M. Wicks, C. P. Koelling, Engineering Economy, 16th ed., Pearson, 2015.
 */
import { describe, expect, it } from 'vitest';
import { irr as referenceIrr, npv as referenceNpv } from 'financial';
import {
  discountedPaybackOfEscalatingSavings,
  discountedPaybackYears,
  escalatingSeriesFactor,
  internalRateOfReturn,
  internalRateOfReturnOfEscalatingSavings,
  netPresentValue,
  netPresentValueOfEscalatingSavings,
  savingsCashFlows,
} from '../../../../calc/economics/cash-flows.js';
import { roundMoney } from '../../../../calc/economics/money.js';
import { seededRandom } from '../../../support/random.js';

/** Random investments over the ranges the assessment allows (rates −50…100 %/a, escalation −20…50 %/a, lives 1–50 a). */
function investments(count: number, seed: number) {
  const random = seededRandom(seed);
  const pick = <T>(list: readonly T[]): T => list[Math.floor(random() * list.length)]!;
  return Array.from({ length: count }, () => {
    const capex = random() < 0.05 ? 0 : Math.round(random() * 10 ** (2 + random() * 4) * 100) / 100;
    const savings = (random() < 0.1 ? -1 : 1) * Math.round(random() * 10 ** (1 + random() * 4) * 100) / 100;
    const years = random() < 0.7 ? pick([10, 15, 20]) : 1 + Math.floor(random() * 50);
    const rate = random() < 0.6 ? pick([0, 0.02, 0.05, 0.08, 0.1, -0.05, 0.3]) : -0.5 + random() * 1.5;
    const escalation = random() < 0.6 ? pick([0, 0.02, 0.03, 0.08, -0.03]) : -0.2 + random() * 0.7;
    return { capex, savings, years, rate, escalation };
  });
}

describe('closed-form economics of an escalating savings series', () => {
  it('gives the NPV of the year-by-year sum to the cent for 20,000 random investments, equal rates included (identity of two forms of [1] Ch. 4)', () => {
    const cases = investments(20000, 11);
    cases.push({ capex: 2000, savings: 700, years: 15, rate: 0.08, escalation: 0.08 }, { capex: 100, savings: 50, years: 7, rate: 0.05, escalation: 0.05 + 1e-9 });
    for (const { capex, savings, years, rate, escalation } of cases) {
      const factor = escalatingSeriesFactor(years, rate, escalation);
      const closed = netPresentValueOfEscalatingSavings(capex, savings, factor, escalation);
      expect(roundMoney(closed)).toBe(roundMoney(netPresentValue(rate, savingsCashFlows(capex, savings, years, escalation))));
    }
  });

  it('keeps the cents of the year-by-year sum where the rates are close but not equal and the amounts large (cancellation in 1 − x^N; common practice, no source)', () => {
    // Discount rate and escalation 1e-6 to 1e-3 apart, present values of 1e5 to 1e7: the closed form
    // loses about ε/|i − g| of the present value here, up to a tenth of a cent.
    const random = seededRandom(16);
    const wrong: string[] = [];
    for (let run = 0; run < 20000; run += 1) {
      const escalation = -0.2 + random() * 0.7;
      const rate = escalation + (random() < 0.5 ? -1 : 1) * 10 ** (-6 + random() * 3);
      const years = 1 + Math.floor(random() * 50);
      const savings = (10 ** (5 + random() * 2) * (1 + rate)) / years;
      const capex = Math.round(random() * savings * 100) / 100;
      const closed = netPresentValueOfEscalatingSavings(capex, savings, escalatingSeriesFactor(years, rate, escalation), escalation);
      const summed = netPresentValue(rate, savingsCashFlows(capex, savings, years, escalation));
      if (roundMoney(closed) !== roundMoney(summed)) wrong.push(`${capex} ${savings} ${years} ${rate} ${escalation}: ${closed} vs ${summed}`);
    }
    expect(wrong.slice(0, 3)).toEqual([]);
  });

  it('matches the README economics example: capex 2000, saving 700/a, 15 a, 8 %/a, 2 %/a escalation → NPV 4716.81 (calc/README.md, computed by netPresentValue; a regression value, no published source)', () => {
    expect(roundMoney(netPresentValueOfEscalatingSavings(2000, 700, escalatingSeriesFactor(15, 0.08, 0.02), 0.02))).toBe(4716.81);
  });

  it('agrees with the `financial` package npv (numpy-financial convention, CF_0 undiscounted) to 1e-6', () => {
    const random = seededRandom(12);
    for (let run = 0; run < 300; run += 1) {
      const capex = 1000 + random() * 100000;
      const savings = capex * (0.05 + random() * 0.6);
      const years = 1 + Math.floor(random() * 30);
      const escalation = random() * 0.06 - 0.01;
      const rate = random() * 0.2;
      const closed = netPresentValueOfEscalatingSavings(capex, savings, escalatingSeriesFactor(years, rate, escalation), escalation);
      expect(closed).toBeCloseTo(referenceNpv(rate, savingsCashFlows(capex, savings, years, escalation)), 6);
    }
  });

  it('gives exactly the discounted payback of the built series (same operations, [1] Ch. 5)', () => {
    for (const { capex, savings, years, rate, escalation } of investments(20000, 13)) {
      expect(discountedPaybackOfEscalatingSavings(rate, capex, savings, years, escalation)).toBe(discountedPaybackYears(rate, savingsCashFlows(capex, savings, years, escalation)));
    }
  });

  it('finds the IRR of the built series to the 4 decimals assess reports, and null where it finds none (20,000 random investments)', () => {
    const round4 = (value: number | null) => (value === null ? null : Math.round(value * 10000) / 10000);
    let found = 0;
    for (const { capex, savings, years, escalation } of investments(20000, 14)) {
      const closed = internalRateOfReturnOfEscalatingSavings(capex, savings, years, escalation);
      const summed = internalRateOfReturn(savingsCashFlows(capex, savings, years, escalation));
      expect(round4(closed)).toBe(round4(summed));
      if (closed !== null) {
        found += 1;
        expect(Math.abs(closed - summed!)).toBeLessThan(1e-9 * Math.max(1, Math.abs(summed!)));
      }
    }
    expect(found).toBeGreaterThan(10000);
  });

  it('agrees with the `financial` package irr on conventional investments to 1e-8 (where that package converges)', () => {
    const random = seededRandom(15);
    let compared = 0;
    for (let run = 0; run < 300; run += 1) {
      const capex = 1000 + random() * 100000;
      const savings = capex * (0.05 + random() * 0.6);
      const years = 1 + Math.floor(random() * 30);
      const escalation = random() * 0.06 - 0.01;
      const reference = referenceIrr(savingsCashFlows(capex, savings, years, escalation));
      const closed = internalRateOfReturnOfEscalatingSavings(capex, savings, years, escalation);
      if (!Number.isFinite(reference)) continue;
      compared += 1;
      expect(closed).toBeCloseTo(reference, 8);
    }
    expect(compared).toBeGreaterThan(200);
  });

  it('NPV at the IRR is zero (root identity, common practice, no source)', () => {
    const irr = internalRateOfReturnOfEscalatingSavings(5000, 900, 20, 0.02)!;
    expect(Math.abs(netPresentValue(irr, savingsCashFlows(5000, 900, 20, 0.02)))).toBeLessThan(1e-6);
  });

  it('has no IRR without an investment or a saving, as internalRateOfReturn (common practice, no source)', () => {
    // With no investment the NPV stays positive at every rate: no root (capex 0 reaches this through a full rebate).
    expect(internalRateOfReturnOfEscalatingSavings(0, 500, 10, 0.02)).toBeNull();
    expect(internalRateOfReturn(savingsCashFlows(0, 500, 10, 0.02))).toBeNull();
    expect(internalRateOfReturnOfEscalatingSavings(1000, -5, 10, 0.02)).toBeNull();
  });

  it('names the rule broken: a discount rate at or below −100 %', () => {
    expect(() => netPresentValueOfEscalatingSavings(100, 10, escalatingSeriesFactor(5, -1, 0), 0)).toThrow('"discountRate" must be above -100 %');
  });
});
