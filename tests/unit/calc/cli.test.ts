/**
 * The command line as a user runs it: `node --import tsx calc/cli.ts <command>` with JSON on stdin.
 */
import { spawnSync } from 'node:child_process';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';

const root = fileURLToPath(new URL('../../../', import.meta.url));

function run(command: string, input: string): { status: number | null; output: unknown } {
  const child = spawnSync(process.execPath, ['--import', 'tsx', 'calc/cli.ts', command], { cwd: root, input, encoding: 'utf8', timeout: 30_000 });
  return { status: child.status, output: JSON.parse(child.stdout) as unknown };
}

describe('calc CLI', () => {
  it('answers efficiency-class with exit 0 and the IEC 60034-30-1 value (IE3 11 kW 4 poles 50 Hz = 91.4 %, Table 2)', () => {
    const { status, output } = run('efficiency-class', JSON.stringify({ ratedPowerKw: 11, poles: 4, frequencyHz: 50, efficiencyClass: 'IE3' }));
    expect(status).toBe(0);
    expect(output).toMatchObject({ efficiencyPct: 91.4 });
    expect((output as { source: string }).source).toContain('IEC 60034-30-1');
  }, 30_000);

  it('exits 2 on invalid input with {"error": {"message", "field"}}', () => {
    const { status, output } = run('efficiency-class', JSON.stringify({ ratedPowerKw: 11, poles: 3, frequencyHz: 50, efficiencyClass: 'IE3' }));
    expect(status).toBe(2);
    expect(output).toEqual({ error: { message: '"poles" must be 2, 4, 6 or 8', field: 'poles' } });
  }, 30_000);

  it('names the nested field of an assess input', () => {
    const { status, output } = run('assess', JSON.stringify({ motor: { ratedPowerKw: 11, poles: 4, voltageV: 0 }, site: { energyPricePerKwh: 0.1, frequencyHz: 50 } }));
    expect(status).toBe(2);
    expect(output).toEqual({ error: { message: '"motor.voltageV" must be positive', field: 'motor.voltageV' } });
  }, 30_000);
});
