import { describe, expect, it } from 'vitest';
import { runEconomicsCommand } from '../../../../calc/economics/command.js';
import { savingsCashFlows } from '../../../../calc/economics/cash-flows.js';
import { effectiveEnergyPrice } from '../../../../calc/economics/tariff.js';
import { itemCost } from '../../../../calc/economics/price-book.js';

describe('economics command', () => {
  it('gives payback, NPV and IRR of an escalating saving, and of given cash flows (numpy-financial irr example)', () => {
    const result = runEconomicsCommand({ capex: 1000, annualSavings: 400, years: 5, discountRatePct: 10 });
    expect(result.simplePaybackYears).toBe(2.5);
    expect(result.npv).toBeCloseTo(-1000 + 400 * (1 - 1.1 ** -5) / 0.1, 2); // annuity present worth factor (P/A, 10 %, 5) = 3.7908
    const flows = runEconomicsCommand({ cashFlows: [-250000, 100000, 150000, 200000, 250000, 300000], discountRatePct: 10 });
    expect(flows.irr).toBeCloseTo(0.5672303344358536, 12);
    expect(flows.simplePaybackYears).toBe(2);
  });

  it('names the missing or bad field', () => {
    expect(() => runEconomicsCommand({ annualSavings: 1, years: 5, discountRatePct: 8 })).toThrow('"capex" is required unless cashFlows is given');
    expect(() => runEconomicsCommand({ capex: 1, years: 5, discountRatePct: 8 })).toThrow('"annualSavings" is required unless cashFlows is given');
    expect(() => runEconomicsCommand({ capex: 1, annualSavings: 1, discountRatePct: 8 })).toThrow('"years" is required unless cashFlows is given');
    expect(() => runEconomicsCommand({ capex: 1, annualSavings: 1, years: 5 })).toThrow('"discountRatePct" must be a number');
    expect(() => savingsCashFlows(1, 1, 5, 2)).toThrow('"escalation" must be between -0.5 and 1');
    expect(() => effectiveEnergyPrice(undefined, [{ period: 'p', pricePerKwh: -1, hoursShare: 1 }])).toThrow('"timeOfUse.0.pricePerKwh" must be zero or more');
    expect(() => effectiveEnergyPrice(undefined, [{ period: 'p', pricePerKwh: 1, hoursShare: 2 }])).toThrow('"timeOfUse.0.hoursShare" must be between 0 and 1');
    expect(() => itemCost([{ upToKw: 1, costPerKw: 1, fixedCost: 1 }], 0)).toThrow('"ratedPowerKw" must be positive');
  });
});
