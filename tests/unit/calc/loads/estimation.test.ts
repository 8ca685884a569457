import { describe, expect, it } from 'vitest';
import { loadFromCurrent, loadFromInputPower, loadFromSlip } from '../../../../calc/loads/estimation.js';
import { INDUCTION_CONSTANT_LOSS_SHARE, lossSplit, machineLossKw } from '../../../../calc/efficiency/part-load.js';

describe('load estimation (US DOE motor-load fact sheet methods)', () => {
  it('inverts the loss model exactly from measured input power (round trip)', () => {
    const split = lossSplit(15, 0.92, INDUCTION_CONSTANT_LOSS_SHARE);
    for (const load of [0.2, 0.5, 0.8, 1.1]) {
      const input = 15 * load + machineLossKw(split, 1, load);
      const estimate = loadFromInputPower(input, split);
      expect(estimate.loadFraction).toBeCloseTo(load, 10);
      expect(estimate.uncertaintyPct).toBe(5);
    }
    expect(loadFromInputPower(split.constantLossKw / 2, split).loadFraction).toBe(0);
  });

  it('reads load from slip: 1800 rpm synchronous, 1750 rpm nameplate, 1770 rpm measured → 60 % (DOE fact sheet slip method; arithmetic)', () => {
    const estimate = loadFromSlip(1770, 1750, 4, 60);
    expect(estimate.loadFraction).toBeCloseTo(0.6, 12);
    expect(estimate.uncertaintyPct).toBe(20); // NEMA MG 1 12.46: nameplate speed within 20 % of rated slip
  });

  it('corrects slip for supply voltage (slip ∝ 1/V², DOE fact sheet)', () => {
    // At 10 % overvoltage the rated slip shrinks by 1/1.21, so the same measured slip means more load.
    const corrected = loadFromSlip(1770, 1750, 4, 60, 506, 460).loadFraction;
    expect(corrected).toBeCloseTo(0.6 * 1.21, 10);
    expect(() => loadFromSlip(1770, 1750, 4, 60, 506)).toThrow('"measuredVoltageV" and ratedVoltageV must be given together');
  });

  it('reads load from current, and removes the magnetising current in quadrature when the no-load current is known', () => {
    expect(loadFromCurrent(20, 25).loadFraction).toBeCloseTo(0.8, 12);
    expect(loadFromCurrent(20, 25).uncertaintyPct).toBe(10);
    const quadrature = loadFromCurrent(Math.sqrt(10 ** 2 + 0.5 ** 2 * (25 ** 2 - 10 ** 2)), 25, undefined, undefined, 10);
    expect(quadrature.loadFraction).toBeCloseTo(0.5, 12);
    // The plain current ratio overstates light load: the quadrature estimate is lower.
    expect(quadrature.loadFraction).toBeLessThan(loadFromCurrent(Math.sqrt(10 ** 2 + 0.25 * 525), 25).loadFraction);
    expect(loadFromCurrent(8, 25).uncertaintyPct).toBe(30);
  });

  it('refuses impossible measurements', () => {
    expect(() => loadFromSlip(1810, 1750, 4, 60)).toThrow('"measuredSpeedRpm" must be between 1260 and 1800');
    expect(() => loadFromSlip(1770, 1800, 4, 60)).toThrow('"ratedSpeedRpm" must be between');
    expect(() => loadFromCurrent(-1, 25)).toThrow('"measuredCurrentA" must be positive');
    expect(() => loadFromInputPower(0, lossSplit(1, 0.9, 0.3))).toThrow('"measuredInputKw" must be positive');
    expect(() => loadFromCurrent(10, 25, undefined, undefined, 25)).toThrow('"noLoadCurrentA" must be between');
  });
});

describe('load estimation: remaining input rules', () => {
  it('names each field', () => {
    expect(() => loadFromSlip(1470, 1450, 0, 50)).toThrow('"poles" must be positive');
    expect(() => loadFromSlip(1470, 1450, 4, 0)).toThrow('"frequencyHz" must be positive');
    expect(() => loadFromSlip(1470, 1450, 4, 50, 0, 400)).toThrow('"measuredVoltageV" must be positive');
    expect(() => loadFromCurrent(10, 0)).toThrow('"ratedCurrentA" must be positive');
  });
});
