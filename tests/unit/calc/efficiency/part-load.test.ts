import { describe, expect, it } from 'vitest';
import {
  INDUCTION_CONSTANT_LOSS_SHARE,
  PM_CONSTANT_LOSS_SHARE,
  inductionReactiveKvar,
  lossSplit,
  machineLossKw,
  partLoadEfficiency,
  rewoundEfficiency,
  typicalRatedPowerFactor,
} from '../../../../calc/efficiency/part-load.js';
import { readPartLoadCurve, checkPartLoadCurve } from '../../../../calc/efficiency/part-load-curve.js';

describe('part-load loss model (loss segregation, IEC 60034-2-1)', () => {
  const split = lossSplit(11, 0.914, INDUCTION_CONSTANT_LOSS_SHARE);

  it('reproduces the rated efficiency at rated load and splits the losses as asked (identity)', () => {
    expect(partLoadEfficiency(split, 1, 1)).toBeCloseTo(0.914, 12);
    expect(split.constantLossKw / (split.constantLossKw + split.loadLossKw)).toBeCloseTo(INDUCTION_CONSTANT_LOSS_SHARE, 12);
  });

  it('keeps losses positive, efficiency below 1 and input = output + losses from 0 to 125 % load', () => {
    for (let load = 0; load <= 1.25; load += 0.05) {
      for (const speed of [0.3, 0.6, 1]) {
        const losses = machineLossKw(split, speed, load);
        const output = 11 * speed * load;
        const efficiency = partLoadEfficiency(split, speed, load);
        expect(losses).toBeGreaterThan(0);
        expect(efficiency).toBeLessThan(1);
        if (output > 0) expect(output / efficiency).toBeCloseTo(output + losses, 10);
      }
    }
  });

  it('peaks where the load losses equal the constant losses, L = √(P_c/P_v) (REFERENCES.md section 5)', () => {
    const peak = Math.sqrt(split.constantLossKw / split.loadLossKw);
    const at = (load: number) => partLoadEfficiency(split, 1, load);
    expect(at(peak)).toBeGreaterThan(at(peak - 0.02));
    expect(at(peak)).toBeGreaterThan(at(peak + 0.02));
  });

  it('follows the US DOE part-load curves within 0.04 from 40 % to 100 % load; below 40 % it departs by up to 0.37 (7.5 kW at 10 % load) (the L² law ignores magnetising current; DOE fact sheet 2014, REFERENCES.md section 5)', () => {
    const doe: Record<number, [number, number][]> = {
      7.5: [[0.1, 0.458], [0.2, 0.753], [0.3, 0.887], [0.4, 0.95], [0.6, 1], [0.8, 1], [1, 1]],
      15: [[0.1, 0.576], [0.2, 0.843], [0.3, 0.937], [0.4, 0.98], [0.6, 1], [0.8, 1], [1, 1]],
      35: [[0.1, 0.644], [0.2, 0.903], [0.3, 0.957], [0.4, 1], [0.6, 1], [0.8, 1], [1, 1]],
      70: [[0.1, 0.724], [0.2, 0.963], [0.3, 0.987], [0.4, 1], [0.6, 1], [0.8, 1], [1, 1]],
    };
    for (const [kw, curve] of Object.entries(doe)) {
      const model = lossSplit(Number(kw), 0.92, INDUCTION_CONSTANT_LOSS_SHARE);
      const peak = Math.max(...curve.map(([load]) => partLoadEfficiency(model, 1, load)));
      for (const [load, relative] of curve) {
        const ours = partLoadEfficiency(model, 1, load) / peak;
        if (load >= 0.4) expect(Math.abs(ours - relative), `${kw} kW at ${load}`).toBeLessThanOrEqual(0.04);
        else expect(Math.abs(ours - relative), `${kw} kW at ${load}`).toBeLessThanOrEqual(0.4);
      }
    }
  });

  it('gives a permanent-magnet motor a flatter curve than an induction motor of the same rated efficiency', () => {
    const induction = lossSplit(11, 0.93, INDUCTION_CONSTANT_LOSS_SHARE);
    const magnet = lossSplit(11, 0.93, PM_CONSTANT_LOSS_SHARE);
    expect(partLoadEfficiency(magnet, 1, 0.25)).toBeGreaterThan(partLoadEfficiency(induction, 1, 0.25));
  });

  it('lowers constant losses with speed (s^1.5) and load losses with torque²', () => {
    expect(machineLossKw(split, 0.5, 0)).toBeCloseTo(split.constantLossKw * 0.5 ** 1.5, 12);
    expect(machineLossKw(split, 1, 0.5) - split.constantLossKw).toBeCloseTo(split.loadLossKw * 0.25, 12);
    expect(partLoadEfficiency(split, 0, 0)).toBe(0);
  });
});

describe('power factor versus load', () => {
  it('follows the handbook curve 25 % 0.55 · 50 % 0.73 · 75 % 0.80 · 100 % 0.85 within 0.03 (electrical-installation handbooks, REFERENCES.md section 5)', () => {
    const split = lossSplit(1, 0.9, INDUCTION_CONSTANT_LOSS_SHARE);
    const fullLoadReactive = (1 / 0.9) * Math.tan(Math.acos(0.85));
    const handbook: [number, number][] = [[0.25, 0.55], [0.5, 0.73], [0.75, 0.8], [1, 0.85]];
    for (const [load, expected] of handbook) {
      const input = load + machineLossKw(split, 1, load);
      const reactive = inductionReactiveKvar(fullLoadReactive, 1, load);
      expect(input / Math.hypot(input, reactive), `load ${load}`).toBeCloseTo(expected, 1);
      expect(Math.abs(input / Math.hypot(input, reactive) - expected)).toBeLessThanOrEqual(0.03);
    }
  });

  it('gives typical rated power factors that rise with size and fall with poles (common practice, values from memory)', () => {
    expect(typicalRatedPowerFactor(0.37, 4)).toBe(0.72);
    expect(typicalRatedPowerFactor(100, 4)).toBe(0.87);
    expect(typicalRatedPowerFactor(11, 2)).toBeGreaterThan(typicalRatedPowerFactor(11, 4));
    expect(typicalRatedPowerFactor(11, 8)).toBeLessThan(typicalRatedPowerFactor(11, 6));
  });
});

describe('rewinds and part-load curves', () => {
  it('takes 1 point per rewind by default (common practice, no source) and never halves the efficiency', () => {
    expect(rewoundEfficiency(0.9, 2)).toBeCloseTo(0.88, 12);
    expect(rewoundEfficiency(0.9, 0)).toBe(0.9);
    expect(rewoundEfficiency(0.9, 100, 5)).toBe(0.45);
    expect(() => rewoundEfficiency(0.9, -1)).toThrow('"rewinds" must be zero or more');
    expect(() => rewoundEfficiency(0.9, 1, 20)).toThrow('"rewindPenaltyPctPoints" must be between 0 and 10');
  });

  it('reads a curve linearly and holds its ends', () => {
    const curve = { source: 'test', ratedPowerKw: 10, points: [{ loadFraction: 0.25, efficiency: 0.9, powerFactor: 0.8 }, { loadFraction: 1, efficiency: 0.96, powerFactor: 0.95 }] };
    expect(readPartLoadCurve(curve, 0.625).efficiency).toBeCloseTo(0.93, 12);
    expect(readPartLoadCurve(curve, 0.1).efficiency).toBe(0.9);
    expect(readPartLoadCurve(curve, 1.2).powerFactor).toBe(0.95);
    expect(() => checkPartLoadCurve({ ...curve, points: [curve.points[1]!, curve.points[0]!] }, 'motor.bldcCurve')).toThrow('"motor.bldcCurve.points" must be sorted by loadFraction, strictly increasing');
    expect(() => checkPartLoadCurve({ ...curve, points: [curve.points[0]!] }, 'motor.bldcCurve')).toThrow('"motor.bldcCurve.points" needs at least two points');
    expect(() => checkPartLoadCurve({ ...curve, ratedPowerKw: 0 }, 'c')).toThrow('"c.ratedPowerKw" must be positive');
  });

  it('refuses an impossible split', () => {
    expect(() => lossSplit(-1, 0.9, 0.3)).toThrow('"ratedPowerKw" must be positive');
    expect(() => lossSplit(1, 1.2, 0.3)).toThrow('"efficiency" must be between');
    expect(() => lossSplit(1, 0.9, 1.5)).toThrow('"constantShare" must be between 0 and 1');
  });
});
