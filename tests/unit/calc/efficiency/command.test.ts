import { describe, expect, it } from 'vitest';
import { runEfficiencyClassCommand } from '../../../../calc/efficiency/command.js';

describe('efficiency-class command', () => {
  it('returns IEC and NEMA values with their source (IEC 60034-30-1 Table 2; NEMA MG 1 Table 12-12)', () => {
    expect(runEfficiencyClassCommand({ ratedPowerKw: 11, poles: 4, frequencyHz: 50, efficiencyClass: 'IE3' }).efficiencyPct).toBe(91.4);
    expect(runEfficiencyClassCommand({ ratedPowerKw: 7.5, poles: 4, frequencyHz: 60, efficiencyClass: 'nema-premium' }).efficiencyPct).toBe(91.7); // 10.06 hp → 10 hp
    expect(runEfficiencyClassCommand({ ratedPowerHp: 20, poles: 4, frequencyHz: 50, efficiencyClass: 'IE2' }).efficiencyPct).toBe(90.6); // 14.9 kW: between 11 and 15 kW
    expect(runEfficiencyClassCommand({ ratedPowerKw: 7.5, poles: 4, frequencyHz: 50, efficiencyClass: 'unknown' }).efficiencyPct).toBe(84.2);
  });

  it('names the field of a bad input', () => {
    expect(() => runEfficiencyClassCommand({ poles: 4, frequencyHz: 50, efficiencyClass: 'IE3' })).toThrow('"ratedPowerKw" or ratedPowerHp is required');
    expect(() => runEfficiencyClassCommand({ ratedPowerKw: 11, poles: 4, frequencyHz: 50, efficiencyClass: 'nema-premium' })).toThrow('"frequencyHz" must be 60 for nema-premium');
    expect(() => runEfficiencyClassCommand({ ratedPowerKw: 11, poles: 4, frequencyHz: 50, efficiencyClass: 'IE7' })).toThrow('"efficiencyClass" must be one of IE1, IE2, IE3, IE4, IE5, unknown, nema-premium, epact');
    expect(() => runEfficiencyClassCommand({ ratedPowerKw: -11, poles: 4, frequencyHz: 50, efficiencyClass: 'IE3' })).toThrow('"ratedPowerKw" must be positive');
    expect(() => runEfficiencyClassCommand({ ratedPowerKw: 11, poles: 4, frequencyHz: 55, efficiencyClass: 'IE3' })).toThrow('"frequencyHz" must be 50 or 60');
  });
});

describe('part-load curve checks', () => {
  it('refuses an efficiency or power factor outside (0, 1]', async () => {
    const { checkPartLoadCurve } = await import('../../../../calc/efficiency/part-load-curve.js');
    const point = { loadFraction: 0.5, efficiency: 0.9, powerFactor: 0.9 };
    expect(() => checkPartLoadCurve({ source: 's', ratedPowerKw: 1, points: [{ ...point, loadFraction: 0.2, efficiency: 1.2 }, point] }, 'c')).toThrow('"c.points.0.efficiency" must be between 0 and 1');
    expect(() => checkPartLoadCurve({ source: 's', ratedPowerKw: 1, points: [{ ...point, loadFraction: 0.2, powerFactor: 0 }, point] }, 'c')).toThrow('"c.points.0.powerFactor" must be between 0 and 1');
  });
});
