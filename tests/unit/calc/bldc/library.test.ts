import { describe, expect, it } from 'vitest';
import { LAMINATION_STEELS, MAGNET_GRADES, magnetAtTemperature, resolveMagnet, resolveSteel } from '../../../../calc/bldc/materials.js';
import { frameLimits, nextLargerFrame, standardFrameFor } from '../../../../calc/bldc/frames.js';
import { driveInputPowerFactor, driveLossModel, driveLossW } from '../../../../calc/bldc/drive.js';
import { demagnetisationMargin, magnetWorkingPoint } from '../../../../calc/bldc/demagnetisation.js';
import { regionIronLoss } from '../../../../calc/bldc/losses.js';
import { runWindingCommand, runSweepCommand } from '../../../../calc/bldc/commands.js';
import { sweep } from '../../../../calc/bldc/sweep.js';

describe('material library', () => {
  it('holds sintered NdFeB (with M/H classes), bonded NdFeB and ferrite grades, and several steels', () => {
    const families = new Set(MAGNET_GRADES.map((g) => g.family));
    expect(families).toEqual(new Set(['sintered-ndfeb', 'bonded-ndfeb', 'ferrite']));
    expect(MAGNET_GRADES.map((g) => g.name)).toEqual(expect.arrayContaining(['N35', 'N42', 'N35M', 'N42H']));
    expect(LAMINATION_STEELS.length).toBeGreaterThanOrEqual(3);
  });

  it('uses the §7 grade data: N35 B_r 1.17–1.22 T, H_cJ ≥ 955 kA/m; N42 1.28–1.32 T; M class ≥ 1114 kA/m; Y30 0.38–0.39 T (REFERENCES.md §7)', () => {
    const n35 = resolveMagnet('N35');
    expect(n35.remanenceT).toBeGreaterThanOrEqual(1.17);
    expect(n35.remanenceT).toBeLessThanOrEqual(1.22);
    expect(n35.intrinsicCoercivityAPerM).toBeGreaterThanOrEqual(955e3);
    expect(resolveMagnet('n42').remanenceT).toBeGreaterThanOrEqual(1.28);
    expect(resolveMagnet('N42M').intrinsicCoercivityAPerM).toBeGreaterThanOrEqual(1114e3);
    const y30 = resolveMagnet('ferrite Y30');
    expect(y30.remanenceT).toBeGreaterThanOrEqual(0.38);
    expect(y30.remanenceT).toBeLessThanOrEqual(0.39);
  });

  it('applies the reversible coefficients: N35 at 100 °C loses 9.6 % of B_r (α = −0.12 %/K, §7)', () => {
    expect(magnetAtTemperature(resolveMagnet('N35'), 100).remanenceT).toBeCloseTo(1.19 * (1 - 0.0012 * 80), 12);
    // Ferrite's coercivity rises with temperature (β > 0, §7): worst case cold.
    const y30 = resolveMagnet('ferrite Y30');
    expect(magnetAtTemperature(y30, -20).intrinsicCoercivityAPerM).toBeLessThan(magnetAtTemperature(y30, 100).intrinsicCoercivityAPerM);
  });

  it('reproduces each steel grade’s defining loss at 1.5 T, 50 Hz (EN 10106 designation: M400-50A → 4.00 W/kg)', () => {
    for (const steel of LAMINATION_STEELS) {
      const defined = Number(steel.name.slice(1, 4)) / 100;
      const { hysteresisW, eddyW } = regionIronLoss(steel, 1, 50, 1.5, [1.5]);
      // regionIronLoss includes the building factor 1.3 (common practice): divide it out.
      expect((hysteresisW + eddyW) / 1.3).toBeCloseTo(defined, 9);
    }
  });

  it('refuses unknown names and impossible custom materials', () => {
    expect(() => resolveSteel('M999-99Z')).toThrow('"steel" must be one of');
    expect(() => resolveSteel({ ...resolveSteel('M400-50A'), stackingFactor: 0 })).toThrow('"steel.stackingFactor" must be positive');
    expect(() => resolveMagnet({ ...resolveMagnet('N42'), remanenceT: 2 })).toThrow('"magnet.remanenceT" must be at most 1.6 T');
  });
});

describe('frames', () => {
  it('derives limits from shaft height and foot spacing (IEC 60072-1 values from memory; 1.6·H and 0.9·B common practice)', () => {
    const f = frameLimits('IEC 132S');
    expect(f.shaftHeightMm).toBe(132);
    expect(f.maxStatorOuterDiameterMm).toBeCloseTo(211.2, 9);
    expect(f.maxStackLengthMm).toBeCloseTo(126, 9);
    // NEMA 184T: shaft height 18/4 inch = 114.3 mm (NEMA MG 1 rule).
    expect(frameLimits('184T').shaftHeightMm).toBeCloseTo(114.3, 9);
    expect(nextLargerFrame(f)?.designation).toBe('132M');
    expect(() => frameLimits('999Q')).toThrow('"frame" must be an IEC frame');
  });

  it('knows the standard frame of a rating (REFERENCES.md §4)', () => {
    expect(standardFrameFor(11, 4)).toBe('160M');
    expect(standardFrameFor(7.5, 2)).toBe('132S');
    expect(standardFrameFor(7.5, 6)).toBe('160M');
    expect(standardFrameFor(1000, 4)).toBeUndefined();
  });
});

describe('drive', () => {
  it('three-term losses: fixed + per-ampere + per-ampere² (IEC 61800-9-2 form), zero current leaves the fixed part', () => {
    const m = driveLossModel(11000, 20, 540);
    expect(driveLossW(m, 0)).toBeCloseTo(m.fixedW, 12);
    expect(driveLossW(m, 20)).toBeCloseTo(m.fixedW + 20 * m.perAmpereW + 400 * m.perAmpereSquaredOhm, 9);
    // A typical drive loses 1–3 % at rated load (IEC 61800-9-2 IE1/IE2 drives, common practice).
    expect(driveLossW(m, 20) / 11000).toBeGreaterThan(0.01);
    expect(driveLossW(m, 20) / 11000).toBeLessThan(0.03);
  });

  it('input power factor = displacement × distortion: 0.98/√(1 + 0.4²) = 0.910 at rated load (common practice, no source)', () => {
    expect(driveInputPowerFactor(1)).toBeCloseTo(0.98 / Math.sqrt(1.16), 12);
    expect(driveInputPowerFactor(0.1)).toBeLessThan(driveInputPowerFactor(0.5));
  });
});

describe('demagnetisation', () => {
  it('without armature MMF the working point is on the load line (Hanselman ch. 4)', () => {
    const p = magnetWorkingPoint(1.2, 1.05, 5e-3, 1e-3, 0);
    expect(p.fluxDensityT).toBeCloseTo((1.2 * 5) / (5 + 1.05), 12);
  });

  it('margin falls as the opposing MMF grows and is negative past the knee', () => {
    const grade = resolveMagnet('N35');
    const small = demagnetisationMargin(grade, 80, 4e-3, 1e-3, 500);
    const large = demagnetisationMargin(grade, 80, 4e-3, 1e-3, 8000);
    expect(large.marginPct).toBeLessThan(small.marginPct);
    expect(demagnetisationMargin(grade, 80, 2e-3, 1e-3, 20000).marginPct).toBeLessThan(0);
    expect(small.worstTemperatureC).toBe(80); // NdFeB: worst case hot
    expect(demagnetisationMargin(resolveMagnet('ferrite Y30'), 80, 8e-3, 1e-3, 500).worstTemperatureC).toBe(-20); // ferrite: cold
  });
});

describe('commands winding and sweep', () => {
  it('winding {slots, poles, layers} → windingFactor, harmonics, layout, balanced', () => {
    const out = runWindingCommand({ slots: 9, poles: 6, layers: 2 });
    expect(out.windingFactor).toBeCloseTo(0.866, 3);
    expect(out.balanced).toBe(true);
    expect(out.sides).toHaveLength(18);
    expect(() => runWindingCommand({ slots: 9 })).toThrow('"poles" Invalid input: expected number, received undefined');
  });

  it('sweep of magnet temperature: margin falls and magnet thickness grows monotonically (NdFeB)', { timeout: 300_000 }, () => {
    const rows = sweep({ ratedPowerKw: 4, speedRpm: 1500, supplyVoltageV: 400, slots: 18, poles: 12 }, 'targets.magnetTemperatureC', 20, 120, 4);
    expect(rows.map((r) => r.value)).toEqual([20, 20 + 100 / 3, 20 + 200 / 3, 120]);
    for (let i = 1; i < rows.length; i += 1) {
      expect(rows[i]?.demagnetisationMarginPct ?? 0).toBeLessThan(rows[i - 1]?.demagnetisationMarginPct ?? 0);
      expect(rows[i]?.magnetThicknessMm ?? 0).toBeGreaterThan(rows[i - 1]?.magnetThicknessMm ?? 0);
    }
  });

  it('sweep refuses an unknown parameter, bad steps, and reports refused values as rows', { timeout: 300_000 }, () => {
    const base = { ratedPowerKw: 4, speedRpm: 1500, supplyVoltageV: 400, slots: 18, poles: 12 };
    expect(() => runSweepCommand({ base, parameter: 'colour', from: 0, to: 1, steps: 3 })).toThrow('"parameter" must be one of');
    expect(() => runSweepCommand({ base, parameter: 'speedRpm', from: 0, to: 1, steps: 1 })).toThrow('"steps" must be between 2 and 50');
    expect(() => runSweepCommand({ base: { ...base, ratedPowerKw: 'x' }, parameter: 'speedRpm', from: 0, to: 1, steps: 2 })).toThrow('"base.ratedPowerKw" Invalid input: expected number, received string');
    const rows = sweep(base, 'targets.slotFill', 0.5, 0.9, 2);
    expect(rows[1]?.error).toBe('"targets.slotFill" must be between 0.15 and 0.75');
  });
});
