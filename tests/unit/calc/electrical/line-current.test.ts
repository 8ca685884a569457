import { describe, expect, it } from 'vitest';
import { apparentPowerKva, lineCurrentA, powerFactorFromNameplate } from '../../../../calc/electrical/line-current.js';
import { nemaNominalEfficiencyPct } from '../../../../calc/efficiency/classes.js';
import { typicalRatedPowerFactor } from '../../../../calc/efficiency/part-load.js';

/** NEC (NFPA 70) 2008 Table 430.250, three-phase full-load currents [A] at 230 V and 460 V (REFERENCES.md section 3). */
const NEC_430_250: [number, number, number][] = [
  [1, 4.2, 2.1], [1.5, 6.0, 3.0], [2, 6.8, 3.4], [3, 9.6, 4.8], [5, 15.2, 7.6], [7.5, 22, 11], [10, 28, 14], [15, 42, 21],
  [20, 54, 27], [25, 68, 34], [30, 80, 40], [40, 104, 52], [50, 130, 65], [60, 154, 77], [75, 192, 96], [100, 248, 124],
  [125, 312, 156], [150, 360, 180], [200, 480, 240],
];

describe('line current', () => {
  it('is P/(√3·V·PF): 10 kW at 400 V and PF 0.85 draws 16.98 A (arithmetic)', () => {
    expect(lineCurrentA(10, 0.85, 400)).toBeCloseTo(10000 / (Math.sqrt(3) * 400 * 0.85), 10);
    expect(lineCurrentA(10, 0.85, 400)).toBeCloseTo(16.98, 2);
    expect(apparentPowerKva(10, 0.8)).toBeCloseTo(12.5, 12);
  });

  it('stays below the NEC Table 430.250 full-load currents, at 70–94 % of them, for NEMA Premium 4-pole motors with typical power factor (the NEC values are deliberately high, for conductor sizing)', () => {
    for (const [hp, at230, at460] of NEC_430_250) {
      const kw = hp * 0.7457;
      const efficiency = nemaNominalEfficiencyPct(hp, 4, 'enclosed', 'nema-premium').efficiencyPct / 100;
      const pf = typicalRatedPowerFactor(kw, 4);
      for (const [voltage, table] of [[230, at230], [460, at460]] as const) {
        const ratio = lineCurrentA(kw / efficiency, pf, voltage) / table;
        expect(ratio, `${hp} hp at ${voltage} V`).toBeGreaterThanOrEqual(0.7);
        expect(ratio, `${hp} hp at ${voltage} V`).toBeLessThanOrEqual(0.95);
        if (hp >= 2) expect(ratio, `${hp} hp at ${voltage} V`).toBeGreaterThanOrEqual(0.84);
      }
    }
  });

  it('recovers the power factor from a nameplate (round trip)', () => {
    const current = lineCurrentA(11 / 0.914, 0.82, 400);
    expect(powerFactorFromNameplate(11, 0.914, 400, current)).toBeCloseTo(0.82, 12);
  });

  it('refuses 0 V, a zero power factor and negative power', () => {
    expect(() => lineCurrentA(10, 0.85, 0)).toThrow('"voltageV" must be positive');
    expect(() => lineCurrentA(10, 0, 400)).toThrow('"powerFactor" must be between 0.001 and 1');
    expect(() => lineCurrentA(-1, 0.85, 400)).toThrow('"inputPowerKw" must be between 0 and');
  });
});
