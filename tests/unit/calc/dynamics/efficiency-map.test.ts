import { describe, expect, it } from 'vitest';
import type { BldcLossModel } from '../../../../calc/contracts.js';
import { efficiencyMap, envelopeTorque, operatingPointLosses } from '../../../../calc/dynamics/efficiency-map.js';
import { runEfficiencyMapCommand } from '../../../../calc/dynamics/commands.js';

/** A loss model built by hand (invented 3 kW, 1500 rpm design). */
const lossModel: BldcLossModel = {
  ratedSpeedRpm: 1500,
  ratedTorqueNm: 19.1,
  maxSpeedRpm: 2000,
  maxContinuousTorqueNm: 20,
  peakTorqueNm: 40,
  dcBusV: 540,
  polePairs: 4,
  phaseResistanceOhm: 0.4,
  torqueConstantNmPerA: 2.45,
  backEmfConstantVsPerRad: 1.0,
  ironHysteresisAtRatedW: 40,
  ironEddyAtRatedW: 20,
  magnetEddyAtRatedW: 5,
  frictionAtRatedW: 10,
  windageAtRatedW: 8,
  drive: { fixedW: 15, perAmpereW: 6, perAmpereSquaredOhm: 0.05 },
};

describe('efficiency map', () => {
  it('adds up the losses of one point by hand', () => {
    // At rated point: I = 19.1/2.45 = 7.796 A; Cu = 3·0.4·I² = 72.93 W; iron 60; magnet 5; mech 18;
    // drive 15 + 6·I + 0.05·I² = 64.81 W; output 19.1·157.08 = 3000.2 W → η = 3000.2/3220.9 = 93.15 %
    // (hand calculation, no source).
    const point = operatingPointLosses(lossModel, 1500, 19.1);
    const current = 19.1 / 2.45;
    expect(point.copperW).toBeCloseTo(1.2 * current * current, 10);
    expect(point.totalW).toBeCloseTo(1.2 * current ** 2 + 60 + 5 + 18 + 15 + 6 * current + 0.05 * current ** 2, 9);
    expect(point.efficiency).toBeCloseTo(point.outputW / (point.outputW + point.totalW), 12);
    expect(point.efficiency * 100).toBeCloseTo(93.15, 1);
  });

  it('limits torque by the current at low speed and by the DC bus near V_dc/(2k_e)', () => {
    // Krishnan 2001, §9.4: V_dc = 2k_e·ω + 2R·I; no-load speed 540/2 = 270 rad/s = 2578 rpm (above maxSpeedRpm).
    expect(envelopeTorque(lossModel, 0).peakNm).toBe(40);
    const speed = 2550 * (2 * Math.PI) / 60;
    const current = (540 - 2 * speed) / (2 * 0.4);
    expect(envelopeTorque({ ...lossModel, maxSpeedRpm: 3000 }, 2550).peakNm).toBeCloseTo(2.45 * Math.sqrt(2 / 3) * current, 9);
    expect(current).toBeLessThan(10);
    expect(envelopeTorque(lossModel, 2100).peakNm).toBe(0);
  });

  it('marks points outside the envelope with null and never returns NaN', () => {
    const speeds = Array.from({ length: 40 }, (_, i) => i * 60);
    const torques = Array.from({ length: 40 }, (_, i) => i * 1.2);
    const map = efficiencyMap(lossModel, speeds, torques);
    expect(map.efficiencyPct).toHaveLength(40);
    expect(map.efficiencyPct[0]).toHaveLength(40);
    const flat = map.efficiencyPct.flat();
    expect(flat.some((value) => value === null)).toBe(true);
    for (const value of flat) if (value !== null) expect(Number.isFinite(value) && value >= 0 && value < 100).toBe(true);
    // 2340 rpm is above maxSpeedRpm: the whole column is outside except zero torque.
    expect(map.efficiencyPct[5]![39]).toBeNull();
    expect(map.best).not.toBeNull();
    // Efficiency rises with speed at constant torque in the low-speed region (losses grow slower than output).
    expect(map.efficiencyPct[10]![10]!).toBeGreaterThan(map.efficiencyPct[10]![2]!);
    expect(map.envelope.maxTorqueNm[0]).toBe(40);
    expect(map.envelope.noLoadSpeedRpm).toBeCloseTo((540 / 2) * 60 / (2 * Math.PI), 9);
  });

  it('takes a design with a lossModel field and names bad fields', () => {
    const map = runEfficiencyMapCommand({ design: { lossModel, other: 1 }, speedsRpm: [1500], torquesNm: [10] });
    expect(map.efficiencyPct[0]![0]).toBeGreaterThan(90);
    expect(() => runEfficiencyMapCommand({ lossModel: { ...lossModel, phaseResistanceOhm: -1 }, speedsRpm: [1], torquesNm: [1] })).toThrow(
      '"lossModel.phaseResistanceOhm" must be positive',
    );
    expect(() => runEfficiencyMapCommand({ lossModel, speedsRpm: [-5], torquesNm: [1] })).toThrow('"speedsRpm.0" must be zero or more');
    expect(() => runEfficiencyMapCommand({ speedsRpm: [1], torquesNm: [1] })).toThrow('"lossModel" is required (or design with lossModel)');
  });
});
