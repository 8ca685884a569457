import { describe, expect, it } from 'vitest';
import { affinityPowerKw, flowOperatingPoint, speedControlApplies, type ControlMethod } from '../../../../calc/loads/fans-pumps.js';

describe('affinity laws and speed control', () => {
  it('reproduces the US DOE Industrial Assessment Center example: 50 kW fan from 1200 to 960 rpm draws 25.6 kW (REFERENCES.md section 6)', () => {
    expect(affinityPowerKw(50, 1200, 960)).toBeCloseTo(25.6, 10);
  });

  it('follows the cube law on a fan (no static head): 80 % flow at 80 % speed and 51.2 % power', () => {
    const point = flowOperatingPoint('variable-speed-drive', 0.8, 0);
    expect(point.speedFraction).toBeCloseTo(0.8, 12);
    expect(point.powerFraction).toBeCloseTo(0.512, 12);
    // Same as the DOE example scaled: 50 kW × 0.512 = 25.6 kW.
    expect(50 * point.powerFraction).toBeCloseTo(25.6, 10);
  });

  it('saves less with static head than the cube law says (system curve H = H_s + k·Q², REFERENCES.md section 6)', () => {
    const noHead = flowOperatingPoint('variable-speed-drive', 0.6, 0);
    const withHead = flowOperatingPoint('variable-speed-drive', 0.6, 0.4);
    expect(withHead.powerFraction).toBeGreaterThan(noHead.powerFraction);
    expect(withHead.powerFraction).toBeCloseTo(0.6 * (0.4 + 0.6 * 0.36), 12);
    expect(withHead.speedFraction).toBeGreaterThan(0.6);
  });

  it('draws less with speed control than with throttle, damper or vanes at every part flow, and the same at design flow', () => {
    const throttled: ControlMethod[] = ['throttle-valve', 'outlet-damper', 'inlet-vanes'];
    for (let flow = 0.1; flow < 1; flow += 0.1) {
      const speed = flowOperatingPoint('variable-speed-drive', flow, 0.2).powerFraction;
      for (const method of throttled) expect(flowOperatingPoint(method, flow, 0.2).powerFraction, `${method} at ${flow}`).toBeGreaterThan(speed);
    }
    for (const method of [...throttled, 'variable-speed-drive'] as const) expect(flowOperatingPoint(method, 1, 0).powerFraction).toBeCloseTo(1, 12);
  });

  it('ranks inlet vanes between outlet damper and speed control, as the handbook curves do (fan handbooks, values from memory)', () => {
    for (let flow = 0.3; flow < 1; flow += 0.1) {
      const vanes = flowOperatingPoint('inlet-vanes', flow, 0).powerFraction;
      expect(vanes).toBeLessThan(flowOperatingPoint('outlet-damper', flow, 0).powerFraction);
      expect(vanes).toBeGreaterThan(flowOperatingPoint('variable-speed-drive', flow, 0).powerFraction);
    }
    // Outlet damper at half flow: about 75 % of design power (fan handbook curve, value from memory).
    expect(flowOperatingPoint('outlet-damper', 0.5, 0).powerFraction).toBeCloseTo(0.75, 2);
    // Throttled pump at half flow: about 72 % (pump handbook curve, shut-off power about 45 %; value from memory).
    expect(flowOperatingPoint('throttle-valve', 0.5, 0).powerFraction).toBeCloseTo(0.725, 3);
  });

  it('cycles an on/off (direct-on-line) machine at full power for a share of the time equal to the flow', () => {
    const point = flowOperatingPoint('direct-on-line', 0.4, 0);
    expect(point).toEqual({ powerFraction: 1, speedFraction: 1, runFraction: 0.4 });
    expect(flowOperatingPoint('variable-speed-drive', 0, 0).runFraction).toBe(0);
  });

  it('offers speed control only to fans and pumps not already on a drive', () => {
    expect(speedControlApplies('fan', 'outlet-damper')).toBe(true);
    expect(speedControlApplies('pump', 'direct-on-line')).toBe(true);
    expect(speedControlApplies('pump', 'variable-speed-drive')).toBe(false);
    expect(speedControlApplies('conveyor', 'direct-on-line')).toBe(false);
  });

  it('refuses bad input with the field named', () => {
    expect(() => flowOperatingPoint('outlet-damper', 1.5, 0)).toThrow('"flowFraction" must be between 0 and 1.25');
    expect(() => flowOperatingPoint('outlet-damper', 0.5, 1)).toThrow('"staticHeadFraction" must be between 0 and 0.95');
    expect(() => flowOperatingPoint('bypass' as ControlMethod, 0.5, 0)).toThrow('"controlMethod" must be one of direct-on-line, throttle-valve, outlet-damper, inlet-vanes, variable-speed-drive');
    expect(() => affinityPowerKw(10, 0, 10)).toThrow('"fromSpeedRpm" must be between');
  });
});

describe('affinity law input rules', () => {
  it('names each field', () => {
    expect(() => affinityPowerKw(-1, 1000, 900)).toThrow('"powerKw" must be between 0 and');
    expect(() => affinityPowerKw(1, 1000, -900)).toThrow('"toSpeedRpm" must be between 0 and');
  });
});
