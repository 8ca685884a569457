import { describe, expect, it } from 'vitest';
import { assess } from 'calc/assess/assess';
import { assessInputSchema, type AssessInput } from 'calc/assess/schema';
import { discountedPaybackYears, savingsCashFlows } from 'calc/economics/cash-flows';
import {
  CURVE_LOADS,
  blankDraft,
  computeLive,
  cumulativeCashFlow,
  draftToInput,
  inputToDraft,
  partLoadCurves,
} from 'components/quick-study';

// The README's `assess` example (calc/README.md): a throttled pump with a three-bin duty profile.
const PUMP: AssessInput = assessInputSchema.parse({
  motor: {
    tag: 'P-12',
    ratedPowerKw: 11,
    poles: 4,
    efficiencyClass: 'IE1',
    application: 'pump',
    controlMethod: 'throttle-valve',
    loadFactor: 0.85,
    dutyProfile: [
      { fraction: 1, hours: 1500 },
      { fraction: 0.8, hours: 3000 },
      { fraction: 0.6, hours: 2000 },
    ],
  },
  site: { voltageV: 400, frequencyHz: 50, energyPricePerKwh: 0.14, demandChargePerKwMonth: 4, currency: 'EUR', co2KgPerKwh: 0.3 },
});

describe('the Quick study model', () => {
  it('gives a register motor’s input back unchanged when nothing is edited', () => {
    expect(draftToInput(inputToDraft(PUMP))).toEqual(PUMP);
  });

  it('computes live exactly what calc’s assess answers for the same input', () => {
    const live = computeLive(inputToDraft(PUMP));
    expect(live.errors).toEqual({});
    expect(live.result).toEqual(assess(PUMP.motor, PUMP.site));
    // The README's figures (calc/README.md example, itself checked against the command line).
    expect(live.result?.baseline.annualKwh).toBe(60842.1);
    expect(live.result?.recommended.code).toBe('bldc-vsd');
  });

  it('names the missing field instead of computing', () => {
    const draft = blankDraft();
    expect(draft.motor.ratedPowerKw).toBeNull();
    const live = computeLive(draft);
    expect(live.result).toBeNull();
    expect(live.errors['motor.ratedPowerKw']).toBe('is required');
    draft.motor.ratedPowerKw = 15;
    expect(computeLive(draft).result?.options.length).toBeGreaterThan(6);
  });

  it('reports calc’s own rule when the schema passes but calc refuses', () => {
    const draft = inputToDraft(PUMP);
    draft.motor.loadFactor = 1.25;
    draft.motor.dutyProfile = [{ fraction: 1.25, hours: 100 }];
    const live = computeLive(draft);
    expect(live.result).toBeNull();
    expect(live.errors['motor.dutyProfile.0.fraction']).toBe('gives a shaft load above 125 % of rated');
  });

  it('draws part-load curves per motor option from calc, 10–125 % load, efficiency rising with load at light load', () => {
    const curves = partLoadCurves(PUMP);
    expect(curves.map((curve) => curve.code)).toEqual(['keep', 'rewind', 'ie3', 'ie4', 'ie5', 'bldc']);
    for (const curve of curves) {
      expect(curve.efficiency).toHaveLength(CURVE_LOADS.length);
      expect(curve.efficiency[0]![0]).toBe(10);
      expect(curve.efficiency.at(-1)![0]).toBe(125);
      // Physics: efficiency rises from 10 % to 50 % load; input power rises with load everywhere.
      expect(curve.efficiency[8]![1]).toBeGreaterThan(curve.efficiency[0]![1]);
      curve.inputKw.slice(1).forEach(([, kw], index) => expect(kw).toBeGreaterThan(curve.inputKw[index]![1]));
    }
    // At rated load the IE3 curve reads the IE3 rated efficiency of the result (same model).
    const rated = curves.find((curve) => curve.code === 'ie3')!.efficiency.find(([load]) => load === 100)![1];
    const ie3 = assess(PUMP.motor, PUMP.site).options.find((option) => option.code === 'ie3')!;
    expect(rated).toBeCloseTo(ie3.ratedEfficiencyPct, 1);
  });

  it('ends the cumulative discounted cash flow at the NPV and crosses zero at the discounted payback', () => {
    const result = assess(PUMP.motor, PUMP.site);
    const option = result.options.find((candidate) => candidate.code === 'ie3')!;
    const flow = cumulativeCashFlow(option, undefined);
    expect(flow.points).toHaveLength(option.lifeYears + 1);
    expect(flow.points[0]![1]).toBe(-Math.round(option.capex));
    expect(Math.abs(flow.points.at(-1)![1] - option.npv)).toBeLessThanOrEqual(1);
    expect(flow.paybackYears).toBeCloseTo(option.discountedPaybackYears!, 2);
    expect(flow.paybackYears).toBe(discountedPaybackYears(0.08, savingsCashFlows(option.capex, option.savingsCost, option.lifeYears, 0.02)));
  });
});
