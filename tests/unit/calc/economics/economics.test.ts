import { describe, expect, it } from 'vitest';
import { Decimal } from 'decimal.js';
import { irr as referenceIrr, npv as referenceNpv } from 'financial';
import {
  capitalRecoveryFactor,
  discountedPaybackYears,
  internalRateOfReturn,
  lifeCycleCost,
  netPresentValue,
  presentValueOfEscalatingSeries,
  savingsCashFlows,
  simplePaybackYears,
} from '../../../../calc/economics/cash-flows.js';
import { roundMoney, sumMoney } from '../../../../calc/economics/money.js';
import { annualDemandCost, effectiveEnergyPrice } from '../../../../calc/economics/tariff.js';
import { DEFAULT_PRICE_BOOK, itemCost, rebateAmount } from '../../../../calc/economics/price-book.js';
import { seededRandom } from '../../../support/random.js';

describe('NPV, IRR and payback', () => {
  it('finds the numpy-financial documentation IRR: irr([−250000, 100000, 150000, 200000, 250000, 300000]) = 0.5672303344358536 (REFERENCES.md section 8)', () => {
    expect(internalRateOfReturn([-250000, 100000, 150000, 200000, 250000, 300000])).toBeCloseTo(0.5672303344358536, 12);
  });

  it('agrees with the `financial` npm package (a port of numpy-financial) on NPV and IRR of random investments', () => {
    const random = seededRandom(7);
    for (let run = 0; run < 200; run += 1) {
      const capex = 1000 + random() * 100000;
      const saving = capex * (0.05 + random() * 0.6);
      const flows = savingsCashFlows(capex, saving, 1 + Math.floor(random() * 30), random() * 0.06 - 0.01);
      const rate = random() * 0.2;
      expect(netPresentValue(rate, flows)).toBeCloseTo(referenceNpv(rate, flows), 6);
      const reference = referenceIrr(flows);
      const ours = internalRateOfReturn(flows);
      if (Number.isFinite(reference)) expect(ours, `flows ${flows.length}`).toBeCloseTo(reference, 8);
      // Identity: NPV at the IRR is zero.
      if (ours !== null) expect(netPresentValue(ours, flows)).toBeCloseTo(0, 4);
    }
  });

  it('returns no IRR when the investment never pays back, and none without an investment', () => {
    expect(internalRateOfReturn(savingsCashFlows(1000, -50, 10, 0))).toBeNull();
    expect(internalRateOfReturn([0, 100, 100])).toBeNull();
    // A loss-making but paying-back-in-part investment has a negative IRR.
    expect(internalRateOfReturn(savingsCashFlows(1000, 50, 10, 0))!).toBeLessThan(0);
  });

  it('computes simple payback as capex / first-year saving and none when nothing is saved (Sullivan et al., Engineering Economy, Ch. 5)', () => {
    expect(simplePaybackYears(1200, 400)).toBe(3);
    expect(simplePaybackYears(0, 400)).toBe(0);
    expect(simplePaybackYears(1200, 0)).toBeNull();
    expect(simplePaybackYears(1200, -5)).toBeNull();
  });

  it('computes discounted payback with interpolation in the year it happens', () => {
    // 1000 invested, 400 a year at 10 %: cumulative PV −636.36, −305.79, −5.26, +267.95 → 3 + 5.26/273.21.
    const flows = savingsCashFlows(1000, 400, 5, 0);
    expect(discountedPaybackYears(0.1, flows)).toBeCloseTo(3 + (1000 - 400 / 1.1 - 400 / 1.21 - 400 / 1.331) / (400 / 1.4641), 10);
    expect(discountedPaybackYears(0.1, savingsCashFlows(1000, 100, 5, 0))).toBeNull();
    expect(discountedPaybackYears(0, flows)).toBeCloseTo(2.5, 12);
  });

  it('gives the tabulated capital recovery factor (A/P, 10 %, 10) = 0.16275 (Sullivan et al., Engineering Economy, interest tables)', () => {
    expect(capitalRecoveryFactor(0.1, 10)).toBeCloseTo(0.16275, 5);
    expect(capitalRecoveryFactor(0, 8)).toBeCloseTo(1 / 8, 12);
  });

  it('sums an escalating series in closed form equal to the explicit sum (geometric gradient), also when i = g', () => {
    for (const [rate, escalation] of [[0.08, 0.02], [0.05, 0.05], [0.03, 0.06]] as const) {
      const flows = savingsCashFlows(0, 1000, 15, escalation);
      expect(presentValueOfEscalatingSeries(1000, 15, rate, escalation)).toBeCloseTo(netPresentValue(rate, flows), 8);
    }
    expect(lifeCycleCost(5000, 1000, 15, 0.08, 0.02)).toBeCloseTo(5000 + presentValueOfEscalatingSeries(1000, 15, 0.08, 0.02), 10);
  });

  it('refuses bad input with the field named', () => {
    expect(() => savingsCashFlows(-1, 100, 10, 0)).toThrow('"capex" must be zero or more');
    expect(() => savingsCashFlows(100, 100, 0, 0)).toThrow('"years" must be a whole number from 1 to 100');
    expect(() => netPresentValue(-1, [1])).toThrow('"discountRate" must be above -100 %');
    expect(() => capitalRecoveryFactor(0.1, 0)).toThrow('"years" must be positive');
  });
});

describe('money', () => {
  it('rounds to cents half away from zero, also where binary storage sits just below the half', () => {
    expect(roundMoney(2.675)).toBe(2.68);
    expect(roundMoney(1.005)).toBe(1.01);
    expect(roundMoney(-2.675)).toBe(-2.68);
    expect(roundMoney(10)).toBe(10);
  });

  it('adds exactly in decimal.js and rounds once', () => {
    expect(sumMoney([0.1, 0.2])).toBe(0.3);
    expect(sumMoney(Array.from({ length: 1000 }, () => 0.001))).toBe(1);
    expect(sumMoney([1.005, 0])).toBe(1.01);
  });

  it('gives, in floating point, the same NPV to the cent as an exact decimal.js computation (the measured choice of calc/README.md)', () => {
    const random = seededRandom(11);
    for (let run = 0; run < 500; run += 1) {
      const capex = Math.round(random() * 2_000_000) / 100;
      const saving = Math.round(random() * 500_000) / 100;
      const years = 1 + Math.floor(random() * 30);
      const rate = Math.round(random() * 2000) / 10000;
      const escalation = Math.round(random() * 500) / 10000;
      const float = roundMoney(netPresentValue(rate, savingsCashFlows(capex, saving, years, escalation)));
      let exact = new Decimal(-capex);
      let amount = new Decimal(saving);
      for (let t = 1; t <= years; t += 1) {
        exact = exact.plus(amount.div(new Decimal(1).plus(rate).pow(t)));
        amount = amount.times(new Decimal(1).plus(escalation));
      }
      expect(float, `run ${run}`).toBe(exact.toDecimalPlaces(2, Decimal.ROUND_HALF_UP).toNumber());
    }
  });
});

describe('tariff and price book', () => {
  it('weights time-of-use prices by the share of running hours, and charges demand 12 months a year', () => {
    expect(effectiveEnergyPrice(undefined, [{ period: 'peak', pricePerKwh: 0.3, hoursShare: 0.25 }, { period: 'off-peak', pricePerKwh: 0.1, hoursShare: 0.75 }])).toBeCloseTo(0.15, 12);
    expect(effectiveEnergyPrice(0.12, undefined)).toBe(0.12);
    expect(annualDemandCost(10, 5)).toBe(600);
    expect(() => effectiveEnergyPrice(undefined, undefined)).toThrow('"energyPricePerKwh" is required unless timeOfUse is given');
    expect(() => effectiveEnergyPrice(undefined, [{ period: 'x', pricePerKwh: 0.1, hoursShare: 0 }])).toThrow('"timeOfUse" needs a period with a positive hoursShare');
  });

  it('prices an item by its size band and keeps a rebate within the capex', () => {
    expect(itemCost(DEFAULT_PRICE_BOOK.items.ie3, 5.5)).toBe(150 + 70 * 5.5);
    expect(itemCost(DEFAULT_PRICE_BOOK.items.ie3, 7.5)).toBe(150 + 70 * 7.5);
    expect(itemCost(DEFAULT_PRICE_BOOK.items.ie3, 11)).toBe(300 + 50 * 11);
    expect(itemCost([{ upToKw: 10, costPerKw: 1, fixedCost: 0 }], 20)).toBe(20); // above the last band: last band
    expect(rebateAmount({ fraction: 0.5, fixed: 1000 }, 1200, 10)).toBe(1200);
    expect(rebateAmount({ perKw: 10 }, 1200, 11)).toBe(110);
    expect(() => itemCost([], 10, 'priceBook.items.ie4')).toThrow('"priceBook.items.ie4" needs at least one size band');
  });
});
