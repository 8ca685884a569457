import { describe, expect, it, vi } from 'vitest';

vi.setConfig({ testTimeout: 120_000 });
import { sizeBldc, type BldcResult } from '../../../../calc/bldc/search.js';
import { lossesAt } from '../../../../calc/bldc/design.js';
import { torqueConstants, WAVEFORM_SAMPLES } from '../../../../calc/bldc/electrical.js';
import { runSizeBldcCommand } from '../../../../calc/bldc/commands.js';

/** Every number in a result is finite (no NaN, no Infinity). */
function expectAllFinite(value: unknown, path = ''): void {
  if (typeof value === 'number') expect(Number.isFinite(value), path).toBe(true);
  else if (Array.isArray(value)) value.forEach((v, i) => expectAllFinite(v, `${path}[${i}]`));
  else if (value && typeof value === 'object') for (const [k, v] of Object.entries(value)) expectAllFinite(v, `${path}.${k}`);
}

function need<T>(value: T | undefined, what: string): T {
  if (value === undefined) throw new Error(`missing ${what}`);
  return value;
}

describe('sizeBldc: identities of one design (11 kW, 1500 rpm, 400 V 50 Hz)', () => {
  const r: BldcResult = sizeBldc({ ratedPowerKw: 11, speedRpm: 1500, supplyVoltageV: 400, frequencyHz: 50, objective: 'efficiency' });
  const geometry = need(r.geometry, 'geometry');
  const losses = need(r.losses, 'losses');
  const mass = need(r.massKg, 'mass');
  const omega = (2 * Math.PI * 1500) / 60;

  it('is feasible in the standard frame 160M of an 11 kW 4-pole motor (REFERENCES.md §4) and names its closest limit', () => {
    expect(r.feasible).toBe(true);
    expect(r.frame.designation).toBe('160M');
    expect(geometry.statorOuterDiameterMm).toBeLessThanOrEqual(r.frame.maxStatorOuterDiameterMm + 1e-9);
    expect(geometry.stackLengthMm).toBeLessThanOrEqual(r.frame.maxStackLengthMm + 1e-9);
    expect(r.constraints.every((c) => c.satisfied)).toBe(true);
    expect(r.constraints.map((c) => c.name)).toContain(r.limitingConstraint);
    expectAllFinite(r);
  });

  it('shaft power = torque × speed (P = T·ω)', () => {
    expect(need(r.ratedTorqueNm, 'torque') * omega).toBeCloseTo(11000, 6);
  });

  it('input = output + losses, for the motor and for motor plus drive', () => {
    const motorLosses = losses.copperW + losses.ironW + losses.magnetW + losses.mechanicalW;
    expect(losses.motorW).toBeCloseTo(motorLosses, 9);
    expect(need(r.motorInputPowerW, 'input')).toBeCloseTo(11000 + motorLosses, 6);
    expect(need(r.supplyInputPowerW, 'supply')).toBeCloseTo(11000 + motorLosses + losses.driveW, 6);
    expect(need(r.efficiencyPct, 'eff') / 100).toBeCloseTo(11000 / need(r.motorInputPowerW, 'input'), 12);
    expect(losses.ironW).toBeCloseTo(losses.ironHysteresisW + losses.ironEddyW, 9);
    expect(losses.ironW).toBeCloseTo(losses.ironTeethW + losses.ironYokeW, 9);
  });

  it('electromagnetic torque = torque constant × current, and T_em·ω = P + iron + magnet + mechanical (energy balance, 0.5 %)', () => {
    const tem = need(r.torqueConstantNmPerA, 'kt') * need(r.ratedCurrentA, 'I');
    expect(Math.abs(tem / need(r.electromagneticTorqueNm, 'Tem') - 1)).toBeLessThan(5e-3);
    expect(Math.abs((tem * omega) / (11000 + losses.ironW + losses.magnetW + losses.mechanicalW) - 1)).toBeLessThan(5e-3);
    // Copper loss = 3·R·I² (RMS phase current).
    expect(losses.copperW).toBeCloseTo(3 * need(r.phaseResistanceOhm, 'R') * need(r.ratedCurrentA, 'I') ** 2, 6);
  });

  it('masses = volume × density of each part', () => {
    const v = need(r.volumesM3, 'volumes');
    const d = need(r.densitiesKgPerM3, 'densities');
    expect(mass.copper).toBeCloseTo(v.copper * d.copper, 9);
    expect(mass.statorSteel).toBeCloseTo(v.statorSteel * d.steel, 9);
    expect(mass.rotorSteel).toBeCloseTo(v.rotorSteel * d.steel, 9);
    expect(mass.magnet).toBeCloseTo(v.magnet * d.magnet, 9);
    expect(mass.total).toBeCloseTo(mass.copper + mass.statorSteel + mass.rotorSteel + mass.magnet, 9);
    expect(need(r.powerDensityKwPerKg, 'pd')).toBeCloseTo(11 / mass.total, 12);
    // Magnet volume = pole-arc fraction × annulus × stack (geometry cross-check).
    const rm = geometry.rotorOuterDiameterMm / 2000;
    const rr = geometry.rotorCoreDiameterMm / 2000;
    expect(v.magnet).toBeCloseTo(geometry.magnetArcFraction * Math.PI * (rm * rm - rr * rr) * (geometry.stackLengthMm / 1000), 12);
  });

  it('line back-EMF constant and torque constant per DC ampere agree in SI units (six-step; 4.5 % for a non-ideal waveform)', () => {
    const keLine = need(r.lineBackEmfConstantVsPerRad, 'ke');
    const ktDc = need(r.torqueConstantNmPerDcA, 'kt');
    // For a sinusoidal EMF the six-step window average is 3/π·… = 0.955 of the peak; for a trapezoid 1.
    expect(ktDc / keLine).toBeGreaterThan(0.95);
    expect(ktDc / keLine).toBeLessThanOrEqual(1 + 1e-9);
  });

  it('waveforms: 180 samples, phase A aligned to sin θ, line EMF = e_a − e_b, back-EMF constant = peak/ω', () => {
    const w = need(r.waveforms, 'waveforms');
    expect(w.electricalAngleDeg).toHaveLength(WAVEFORM_SAMPLES);
    const ea = w.phaseBackEmfV.a;
    const peak = Math.max(...ea.map(Math.abs));
    expect(peak / omega).toBeCloseTo(need(r.backEmfConstantVsPerRad, 'ke'), 9);
    expect(Math.abs(ea[0] ?? 1)).toBeLessThan(0.05 * peak); // zero crossing at 0°
    expect(ea[45] ?? 0).toBeGreaterThan(0.9 * peak); // 90° near the peak
    w.lineBackEmfV.forEach((v, k) => expect(v).toBeCloseTo((ea[k] ?? 0) - (w.phaseBackEmfV.b[k] ?? 0), 9));
    // Triplen harmonics cancel in the line EMF (balanced three-phase winding).
    let s3 = 0;
    let c3 = 0;
    w.lineBackEmfV.forEach((v, k) => {
      s3 += v * Math.sin((3 * 2 * Math.PI * k) / WAVEFORM_SAMPLES);
      c3 += v * Math.cos((3 * 2 * Math.PI * k) / WAVEFORM_SAMPLES);
    });
    expect(Math.hypot(s3, c3) / WAVEFORM_SAMPLES).toBeLessThan(1e-9 * peak + 1e-9);
  });

  it('simulation parameters are physical: R, L > 0, M ≤ 0, shape peak 1, same K_e', () => {
    const s = need(r.simulationParams, 'sim');
    expect(s.phaseResistanceOhm).toBeGreaterThan(0);
    expect(s.phaseInductanceH).toBeGreaterThan(0);
    expect(s.mutualInductanceH).toBeLessThanOrEqual(0);
    expect(s.phaseInductanceH).toBeGreaterThan(-s.mutualInductanceH);
    expect(Math.max(...need(s.backEmfShape, 'shape').map(Math.abs))).toBeCloseTo(1, 9);
    expect(s.backEmfConstantVsPerRad).toBe(r.backEmfConstantVsPerRad);
    expect(s.polePairs * 2).toBe(r.poles);
    expect(s.dcBusV).toBeCloseTo(1.35047 * 400 * 0.97, 2); // Mohan et al. Eq. (5-60): (3√2/π)·V_LL, less 3 % (common practice)
  });

  it('loss model reproduces the rated losses, and the part-load curve covers 10–125 % sorted, matching at 100 %', () => {
    const m = need(r.lossModel, 'lossModel');
    const at = lossesAt(m, 1500, m.ratedTorqueNm);
    expect(Math.abs(at.motorW / losses.motorW - 1)).toBeLessThan(5e-3);
    expect(Math.abs(at.driveW / losses.driveW - 1)).toBeLessThan(5e-3);
    const curve = need(r.partLoadCurve, 'curve');
    const loads = curve.points.map((p) => p.loadFraction);
    expect(loads[0]).toBe(0.1);
    expect(loads[loads.length - 1]).toBe(1.25);
    expect([...loads].sort((a, b) => a - b)).toEqual(loads);
    const full = need(curve.points.find((p) => p.loadFraction === 1), 'full load');
    expect(Math.abs(full.efficiency * 100 - need(r.systemEfficiencyPct, 'sys'))).toBeLessThan(0.1);
    for (const p of curve.points) {
      expect(p.efficiency).toBeGreaterThan(0);
      expect(p.efficiency).toBeLessThan(1);
      expect(p.powerFactor).toBeGreaterThan(0);
      expect(p.powerFactor).toBeLessThanOrEqual(1);
    }
    // Efficiency falls at light load where fixed losses dominate (monotonic below 25 %).
    expect(curve.points[0]?.efficiency ?? 1).toBeLessThan(curve.points[1]?.efficiency ?? 0);
    // Power factor of the drive's input rises with load (distortion falls).
    expect(curve.points[0]?.powerFactor ?? 1).toBeLessThan(full.powerFactor);
  });

  it('winding data for the table and cross-section: every slot filled, balanced', () => {
    const w = need(r.winding, 'winding');
    expect(w.balanced).toBe(true);
    expect(new Set(w.sides.map((s) => s.slot)).size).toBe(r.slots);
  });
});

describe('back-EMF constant = torque constant in SI units (Hanselman ch. 6; ideal trapezoid)', () => {
  it('six-step with a 120° flat-top trapezoid: torque per DC ampere = 2·k_e = line K_e, no ripple', () => {
    const trap = (deg: number) => {
      const d = ((deg % 360) + 360) % 360;
      if (d < 30) return d / 30;
      if (d < 150) return 1;
      if (d < 210) return 1 - (d - 150) / 30;
      if (d < 330) return -1;
      return -1 + (d - 330) / 30;
    };
    const emfs = [0, 120, 240].map((shift) => Array.from({ length: WAVEFORM_SAMPLES }, (_, k) => trap((k * 360) / WAVEFORM_SAMPLES - shift)));
    const kt = torqueConstants(emfs, 'six-step');
    expect(kt.perDcAmpere).toBeCloseTo(2, 12);
    expect(kt.ripple).toBeCloseTo(0, 12);
    expect(kt.perRmsAmpere).toBeCloseTo(2 / Math.sqrt(2 / 3), 12);
  });

  it('sinusoidal drive: k_t = 3·E_rms/ω per RMS ampere', () => {
    const emfs = [0, 120, 240].map((shift) => Array.from({ length: WAVEFORM_SAMPLES }, (_, k) => Math.sin(((k * 360) / WAVEFORM_SAMPLES - shift) * (Math.PI / 180))));
    expect(torqueConstants(emfs, 'sinusoidal').perRmsAmpere).toBeCloseTo(3 / Math.SQRT2, 12);
  });
});

describe('bad input and infeasible requests give clear answers', () => {
  it('names the field and the rule', () => {
    expect(() => sizeBldc({ ratedPowerKw: 11, speedRpm: 50, supplyVoltageV: 400 })).toThrow('"speedRpm" must be between 100 and 30000');
    expect(() => sizeBldc({ ratedPowerKw: 11, speedRpm: 1500, supplyVoltageV: 400, frame: '133X' })).toThrow('"frame" must be an IEC frame such as "132S" or a NEMA T frame such as "184T"');
    expect(() => sizeBldc({ ratedPowerKw: 11, speedRpm: 1500, supplyVoltageV: 400, magnet: 'unobtainium' })).toThrow('"magnet" must be one of');
    expect(() => sizeBldc({ ratedPowerKw: 300, speedRpm: 1500, supplyVoltageV: 400 })).toThrow('"frame" is needed: no standard frame is listed for 300 kW at 4 poles');
    expect(() => sizeBldc({ ratedPowerKw: 11, speedRpm: 1500, supplyVoltageV: 400, targets: { slotFill: 0.9 } })).toThrow('"targets.slotFill" must be between 0.15 and 0.75');
    expect(() => sizeBldc({ ratedPowerKw: 11, speedRpm: 1500, supplyVoltageV: 400, slots: 15, poles: 12 })).toThrow('"slots" gives no balanced winding with a winding factor of 0.85 or more');
    expect(() => runSizeBldcCommand({ ratedPowerKw: -1, speedRpm: 1500, supplyVoltageV: 400 })).toThrow('"ratedPowerKw" must be positive');
    expect(() => runSizeBldcCommand({ ratedPowerKw: 1, speedRpm: 1500, supplyVoltageV: 400, colour: 'red' })).toThrow('"" Unrecognized key: "colour"');
    expect(() => sizeBldc({ ratedPowerKw: 11, speedRpm: 1500, supplyVoltageV: 400, magnet: { ...customMagnet, remanenceT: -1 } })).toThrow('"magnet.remanenceT" must be positive');
  });

  const customMagnet = {
    name: 'my ferrite',
    family: 'ferrite' as const,
    remanenceT: 0.42,
    intrinsicCoercivityAPerM: 300e3,
    remanenceTempCoeffPerK: -0.002,
    coercivityTempCoeffPerK: 0.003,
    recoilPermeability: 1.1,
    maxTemperatureC: 200,
    densityKgPerM3: 4900,
    conductivitySPerM: 1e-4,
    pricePerKg: 3,
    source: 'user',
  };

  it('accepts a custom magnet object (the user extends the library)', () => {
    const r = sizeBldc({ ratedPowerKw: 1.5, speedRpm: 1500, supplyVoltageV: 400, magnet: customMagnet, targets: { airgapFluxDensityT: 0.35 }, slots: 12, poles: 8 });
    expect(r.assumptions.join(' ')).toContain('my ferrite');
    expectAllFinite(r);
  });

  it('an 11 kW 4-pole motor in a 90S frame is infeasible: limiting constraint and the nearest feasible alternative (next frame or longer stack)', () => {
    const r = sizeBldc({ ratedPowerKw: 11, speedRpm: 1500, supplyVoltageV: 400, frame: '90S' });
    expect(r.feasible).toBe(false);
    expect(['stack length', 'torque per rotor volume', 'current density']).toContain(r.limitingConstraint);
    const violated = r.constraints.filter((c) => !c.satisfied).map((c) => c.name);
    expect(violated).toContain(r.limitingConstraint);
    const nearest = need(r.nearestFeasible, 'nearestFeasible');
    expect(['frame', 'maxStackLengthMm']).toContain(nearest.field);
    expect(nearest.design.feasible).toBe(true);
    expectAllFinite(r);
  });

  it('an 80 °C grade asked to run at 100 °C breaks the magnet temperature limit and suggests a hotter grade', () => {
    const r = sizeBldc({ ratedPowerKw: 4, speedRpm: 1500, supplyVoltageV: 400, magnet: 'N35' });
    expect(r.feasible).toBe(false);
    expect(r.constraints.find((c) => c.name === 'magnet temperature')?.satisfied).toBe(false);
    expect(r.nearestFeasible?.field).toBe('magnet');
  });

  it('an efficiency floor that cannot be met is reported, never a NaN', () => {
    const r = sizeBldc({ ratedPowerKw: 0.37, speedRpm: 3000, supplyVoltageV: 400, minEfficiencyPct: 99.5 });
    expect(r.feasible).toBe(false);
    expect(r.limitingConstraint).toBe('efficiency');
    expectAllFinite(r);
  });

  it('a DC bus supply is used as given', () => {
    const r = sizeBldc({ ratedPowerKw: 0.37, speedRpm: 3000, supplyVoltageV: 48, supplyType: 'dc', maxStatorOuterDiameterMm: 110, maxStackLengthMm: 80 });
    expect(r.dcBusV).toBe(48);
    expect(r.frame.system).toBe('free');
    expectAllFinite(r);
  });
});
