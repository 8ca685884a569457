import { describe, expect, it } from 'vitest';
import { historyLines, historyTitle } from 'components/motor-history';
import { neutraliseFormula, selectedMotorsRows } from 'components/motors-export';
import { formatPower, hpToKw, kwToHp, toKw } from 'composables/usePowerUnit';
import { motor } from './motor-fixtures';

const kw = (value: number) => formatPower(value, 'kW');

describe('motor history in words', () => {
  it('says what an edit changed, field by field, in the screens’ words', () => {
    const lines = historyLines(
      {
        action: 'update',
        changes: {
          ratedPowerKw: { from: 7.5, to: 11 },
          controlMethod: { from: 'throttle-valve', to: 'variable-speed-drive' },
          dutyProfile: { from: null, to: [{ fraction: 0.5, hours: 2000 }, { fraction: 1, hours: 1000 }] },
        },
      },
      kw,
    );
    expect(lines).toEqual([
      'Rated power: 7.5 kW → 11 kW',
      'Control method: Throttling valve → Variable-speed drive',
      'Duty profile: — → 2 bins, 3,000 h',
    ]);
    expect(historyTitle('update')).toBe('Edited');
  });

  it('describes files, measurements and imports', () => {
    expect(historyLines({ action: 'add-file', changes: { kind: 'nameplate-photo', fileName: 'plate.jpg' } }, kw)).toEqual(['Nameplate photo: plate.jpg']);
    expect(historyLines({ action: 'add-measurement', changes: { measuredAt: '2026-03-02', inputPowerKw: 5.2, currentA: 9.8 } }, kw)).toEqual(['2026-03-02: 5.2 kW in, 9.8 A']);
    expect(historyLines({ action: 'import-update', changes: { importBatchId: 3, row: 7, changes: { speedRpm: { from: 1450, to: 1460 } } } }, kw)).toEqual([
      'Import #3, row 7',
      'Rated speed: 1,450 rpm → 1,460 rpm',
    ]);
    expect(historyTitle('import-create')).toBe('Added by an import');
  });
});

describe('power units', () => {
  it('converts with 1 hp = 0.7457 kW both ways', () => {
    // Mechanical horsepower: 550 ft·lbf/s = 745.7 W (to four significant figures).
    expect(hpToKw(10)).toBeCloseTo(7.457, 12);
    expect(kwToHp(7.457)).toBeCloseTo(10, 12);
    expect(toKw(10, 'hp')).toBe(7.457);
    expect(toKw(7.5, 'kW')).toBe(7.5);
    expect(formatPower(75, 'hp')).toBe('101 hp'); // 100.58 hp, whole above 100
    expect(formatPower(7.5, 'hp')).toBe('10.1 hp');
    expect(formatPower(null, 'kW')).toBe('—');
  });
});

describe('exporting a selection', () => {
  it('writes the export’s columns and neutralises formula-like text', () => {
    expect(neutraliseFormula('=HYPERLINK("x")')).toBe(`'=HYPERLINK("x")`);
    expect(neutraliseFormula('@SUM(A1)')).toBe(`'@SUM(A1)`);
    expect(neutraliseFormula('P-101')).toBe('P-101');
    const rows = selectedMotorsRows([motor({ description: '+cmd|calc', dutyProfile: [{ fraction: 0.5, hours: 2000 }] })]);
    expect(rows[0]?.slice(0, 3)).toEqual(['Site', 'Tag', 'Description']);
    expect(rows[1]?.slice(0, 3)).toEqual(['Kestrel Valley Dairy', 'D-P-101', `'+cmd|calc`]);
    expect(rows[1]).toContain('0.5:2000');
  });
});
