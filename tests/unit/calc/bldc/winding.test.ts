import { describe, expect, it } from 'vitest';
import { windingLayout } from '../../../../calc/bldc/winding.js';

describe('windingLayout (star of slots)', () => {
  // Published k_w1 of double-layer windings: Cros & Viarouge, IEEE Trans. Energy Conversion 17(2),
  // 2002, and the integral-slot values (REFERENCES.md §7 table); tolerance 0.0006 (3 decimals printed).
  const table: Array<[number, number, number | undefined, number]> = [
    [9, 6, undefined, 0.866],
    [12, 8, undefined, 0.866],
    [12, 10, undefined, 0.933],
    [12, 14, undefined, 0.933],
    [9, 8, undefined, 0.945],
    [9, 10, undefined, 0.945],
    [18, 16, undefined, 0.945],
    [27, 24, undefined, 0.945],
    [24, 20, undefined, 0.933],
    [24, 22, undefined, 0.949],
    [36, 34, undefined, 0.953],
    [24, 4, 6, 0.966],
    [24, 4, 5, 0.933],
    [36, 4, 9, 0.96],
    [36, 4, 8, 0.945],
    [36, 4, 7, 0.902],
    [48, 4, 12, 0.958],
    [48, 4, 10, 0.925],
    [36, 6, 6, 0.966],
    [36, 6, 5, 0.933],
  ];
  it.each(table)('%i slots / %i poles, pitch %s: k_w1 = %f (Cros & Viarouge 2002; REFERENCES.md §7)', (slots, poles, pitch, expected) => {
    const layout = windingLayout(slots, poles, 2, pitch);
    expect(layout.windingFactor).toBeCloseTo(expected, 3 - 0.2);
    expect(Math.abs(layout.windingFactor - expected)).toBeLessThan(6e-4);
    expect(layout.balanced).toBe(true);
  });

  it('single-layer 12/10 has k_w1 = 0.966 (Cros & Viarouge 2002, single-layer table, value from memory)', () => {
    const layout = windingLayout(12, 10, 1);
    expect(Math.abs(layout.windingFactor - 0.966)).toBeLessThan(6e-4);
    expect(layout.sides).toHaveLength(12);
  });

  it('k_w1 = k_d·k_p for an integral-slot winding (Pyrhönen et al. §2): 36/4, pitch 8', () => {
    const q = 3;
    const alpha = (2 * Math.PI * 2) / 36;
    const kd = Math.sin((q * alpha) / 2) / (q * Math.sin(alpha / 2));
    const kp = Math.sin(((8 / 9) * Math.PI) / 2);
    const layout = windingLayout(36, 4, 2, 8);
    expect(layout.windingFactor).toBeCloseTo(kd * kp, 10);
    expect(layout.pitchFactor).toBeCloseTo(kp, 10);
    expect(layout.distributionFactor).toBeCloseTo(kd, 10);
  });

  it('lays every slot with two coil sides, each phase the same number, phases 120° apart with B lagging', () => {
    const layout = windingLayout(12, 10);
    for (let slot = 0; slot < 12; slot += 1) expect(layout.sides.filter((s) => s.slot === slot)).toHaveLength(2);
    for (const phase of ['A', 'B', 'C'] as const) expect(layout.coils.filter((c) => c.phase === phase)).toHaveLength(4);
    // Working harmonic is order p = 5 with the table's factor; the 3rd (sub-)harmonic of 12/10 is 0.5 (star of slots, hand calculation).
    expect(layout.harmonics.find((h) => h.mechanicalOrder === 5)?.factor).toBeCloseTo(0.933, 3);
    expect(layout.harmonics.find((h) => h.mechanicalOrder === 3)?.factor).toBeCloseTo(0.5, 6);
    expect(layout.periodicity).toBe(1);
    expect(layout.coggingPeriodsPerRevolution).toBe(60);
  });

  it('gives the harmonic factors k_wν = k_dν·k_pν of an integral-slot winding (Pyrhönen et al. §2): 36/4 full pitch, ν = 3, 5, 7', () => {
    const layout = windingLayout(36, 4, 2, 9);
    const alpha = (2 * Math.PI * 2) / 36;
    for (const nu of [3, 5, 7]) {
      const kd = Math.sin((3 * nu * alpha) / 2) / (3 * Math.sin((nu * alpha) / 2));
      const kp = Math.sin((nu * Math.PI) / 2);
      expect(layout.harmonics.find((h) => h.electricalOrder === nu)?.factor).toBeCloseTo(Math.abs(kd * kp), 10);
    }
    // Even harmonics are absent from a winding with half-wave symmetry.
    expect(layout.harmonics.find((h) => h.electricalOrder === 2)).toBeUndefined();
  });

  it('refuses impossible windings with the field and the rule', () => {
    expect(() => windingLayout(10, 4)).toThrow('"slots" must be a multiple of 3 for a three-phase winding');
    expect(() => windingLayout(12, 5)).toThrow('"poles" must be an even whole number between 2 and 120');
    expect(() => windingLayout(12, 12)).toThrow('"slots" must differ from the number of poles (k_w1 = 0 for Q = 2p)');
    expect(() => windingLayout(9, 8, 1)).toThrow('"layers" single layer gives no balanced winding for 9 slots / 8 poles with pitch 1');
    expect(() => windingLayout(12, 10, 2, 7)).toThrow('"coilPitch" must be a whole number between 1 and 6');
    expect(() => windingLayout(2.5, 4)).toThrow('"slots" must be a whole number between 3 and 240');
  });

  it('flags an unbalanced combination instead of hiding it', () => {
    // Q/(3t) must be whole for a balanced double-layer winding (Bianchi & Dai Pré 2006): 15/12 has t = 3, Q/(3t) = 5/3.
    expect(windingLayout(15, 12).balanced).toBe(false);
    expect(windingLayout(15, 10).balanced).toBe(true);
  });
});
