import { describe, expect, it } from 'vitest';
import { runLineCurrentCommand } from '../../../../calc/electrical/command.js';
import { powerFactorFromNameplate } from '../../../../calc/electrical/line-current.js';

describe('line-current command', () => {
  it('takes input power, or output power with efficiency (I = P_out/η/(√3·V·PF), arithmetic)', () => {
    expect(runLineCurrentCommand({ inputPowerKw: 10, powerFactor: 0.85, voltageV: 400 }).currentA).toBeCloseTo(16.98, 2);
    const fromOutput = runLineCurrentCommand({ outputPowerKw: 9, efficiencyPct: 90, powerFactor: 0.85, voltageV: 400 });
    expect(fromOutput.inputPowerKw).toBeCloseTo(10, 12);
    expect(fromOutput.kva).toBeCloseTo(10 / 0.85, 12);
  });

  it('names the missing or bad field', () => {
    expect(() => runLineCurrentCommand({ powerFactor: 0.85, voltageV: 400 })).toThrow('"inputPowerKw" or outputPowerKw with efficiencyPct is required');
    expect(() => runLineCurrentCommand({ outputPowerKw: 9, powerFactor: 0.85, voltageV: 400 })).toThrow('"efficiencyPct" is required with outputPowerKw');
    expect(() => runLineCurrentCommand({ inputPowerKw: 10, powerFactor: 0.85, voltageV: 0 })).toThrow('"voltageV" must be positive');
    expect(() => runLineCurrentCommand({ inputPowerKw: 10, powerFactor: 1.2, voltageV: 400 })).toThrow('"powerFactor" must be at most 1');
    expect(() => powerFactorFromNameplate(11, 0.9, 400, 0)).toThrow('"ratedCurrentA" must be positive');
  });
});
