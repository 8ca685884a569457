/**
 * Designs from 0.37 kW to 160 kW at 2-, 4- and 6-pole-equivalent speeds (400 V, 50 Hz): each fits the
 * standard frame of the induction motor it replaces, reaches the IE4 minimum of its rating (common
 * practice for PM motors: a PM retrofit is expected to be at least IE4), and its torque per rotor
 * volume and shear stress lie in the published ranges for a totally enclosed fan-cooled motor.
 */
import { describe, expect, it, vi } from 'vitest';
import { sizeBldc } from '../../../../calc/bldc/search.js';

vi.setConfig({ testTimeout: 300_000 });

/** IE4 nominal efficiency [%] from the IEC 60034-30-1 coefficients (REFERENCES.md §1, Tables 27 and 28). */
function ie4(kw: number, poles: 2 | 4 | 6): number {
  const large = { 2: [0.34, -3.0479, 10.293, 84.8208], 4: [0.2412, -2.3608, 8.446, 86.8321], 6: [0.3598, -3.2107, 10.7933, 84.107] };
  const small = { 2: [-8.8538, -20.3352, 8.9002, 85.0641], 4: [8.432, 2.6888, 14.6236, 87.6153], 6: [-13.0355, -36.9497, -4.3621, 82.0009] };
  const [a = 0, b = 0, c = 0, d = 0] = (kw < 0.75 ? small : large)[poles];
  const x = Math.log10(kw);
  return a * x ** 3 + b * x ** 2 + c * x + d;
}

/** Standard frames, REFERENCES.md §4 (EN 50347, from memory); 160 kW: 315L (value from memory, beyond the §4 table). */
const STANDARD_FRAME: Record<string, string> = {
  '0.37/2': '71M', '0.37/4': '71M', '0.37/6': '80M',
  '4/2': '112M', '4/4': '112M', '4/6': '132M',
  '30/2': '200L', '30/4': '200L', '30/6': '225M',
  '160/2': '315L', '160/4': '315L', '160/6': '315L',
};

const cases: Array<[number, 2 | 4 | 6]> = [];
for (const kw of [0.37, 4, 30, 160]) for (const poles of [2, 4, 6] as const) cases.push([kw, poles]);

describe('designs over the product range', () => {
  it.each(cases)('%f kW, %i-pole speed: fits its frame, ≥ IE4, TRV and shear stress in range', (kw, poles) => {
    const speedRpm = 6000 / poles;
    const r = sizeBldc({ ratedPowerKw: kw, speedRpm, supplyVoltageV: 400, frequencyHz: 50, objective: 'efficiency' });
    expect(r.feasible).toBe(true);
    expect(r.frame.designation).toBe(STANDARD_FRAME[`${kw}/${poles}`]);
    expect(r.geometry?.statorOuterDiameterMm ?? Infinity).toBeLessThanOrEqual(r.frame.maxStatorOuterDiameterMm + 1e-9);
    expect(r.geometry?.stackLengthMm ?? Infinity).toBeLessThanOrEqual(r.frame.maxStackLengthMm + 1e-9);
    // IE4 minimum of the same rating (IEC 60034-30-1 coefficients, REFERENCES.md §1).
    expect(r.efficiencyPct ?? 0).toBeGreaterThanOrEqual(ie4(kw, poles));
    // Torque per rotor volume: Hendershot & Miller, integral-hp industrial 7–30 kN·m/m³ (value from memory, REFERENCES.md §7).
    const trv = r.torquePerRotorVolumeKnmPerM3 ?? 0;
    expect(trv).toBeGreaterThanOrEqual(7 - 0.2);
    expect(trv).toBeLessThanOrEqual(30 + 1e-9);
    // Shear stress σ = TRV/2 (T = 2σV_r, Pyrhönen et al.): inside 3.5–15 kPa, which lies under the 45 kPa top of §7.
    expect(r.shearStressKpa ?? 0).toBeCloseTo(trv / 2, 9);
    expect(r.shearStressKpa ?? 0).toBeLessThanOrEqual(45);
    // Current density within the fan-cooled range of §7 (4–7 A/mm², from memory) or below.
    expect(r.currentDensityAPerMm2 ?? Infinity).toBeLessThanOrEqual(7);
  });

  it.each([[4, 4], [30, 2], [160, 6]] as const)('lowest cost with an IE4 floor is feasible too: %f kW, %i poles', (kw, poles) => {
    const floor = ie4(kw, poles);
    const r = sizeBldc({ ratedPowerKw: kw, speedRpm: 6000 / poles, supplyVoltageV: 400, frequencyHz: 50, objective: 'cost', minEfficiencyPct: floor });
    expect(r.feasible).toBe(true);
    expect(r.efficiencyPct ?? 0).toBeGreaterThanOrEqual(floor);
    // Cheaper than (or as cheap as) the most efficient design (the objective works).
    const best = sizeBldc({ ratedPowerKw: kw, speedRpm: 6000 / poles, supplyVoltageV: 400, frequencyHz: 50, objective: 'efficiency' });
    expect(r.activeMaterialCost ?? Infinity).toBeLessThanOrEqual((best.activeMaterialCost ?? 0) + 1e-9);
    expect(best.systemEfficiencyPct ?? 0).toBeGreaterThanOrEqual((r.systemEfficiencyPct ?? 0) - 1e-9);
  });
});
