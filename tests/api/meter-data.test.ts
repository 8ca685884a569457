import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { setUploadDir } from '../../server/lib/uploads.js';
import type { Motor, Organization, Site, User } from '../../server/models/index.js';
import { parseDecimal, parseMeterCsv } from '../../server/retrofits/meter-csv.js';
import { studentT90 } from '../../server/retrofits/verification.js';
import { createOrganization, createSite, createUser, signIn, startTestApp, type TestContext } from '../support/api.js';
import { createMotor, createRetrofitRow, dailyProfileCsv, uploadMeter } from '../support/retrofits.js';

let context: TestContext;
let organization: Organization;
let site: Site;
let engineer: User;
let uploadDir: string;

beforeAll(async () => {
  context = await startTestApp();
  uploadDir = mkdtempSync(join(tmpdir(), 'statorline-meter-'));
  setUploadDir(uploadDir);
  organization = await createOrganization();
  site = await createSite(organization);
  engineer = await createUser(organization, 'engineer');
});
afterAll(async () => {
  await context.close();
  rmSync(uploadDir, { recursive: true, force: true });
});

/** An installed retrofit of a fresh 20 kW motor (6000 h/yr in the register), 10 000 kWh/yr predicted. */
async function installedRetrofit(overrides: Partial<Motor['_creationAttributes']> = {}) {
  const motor = await createMotor(organization, site, { ratedPowerKw: 20, hoursPerYear: 6000, ...overrides });
  return createRetrofitRow(organization, motor, engineer.id, { status: 'installed', installationDate: '2026-05-15' });
}

/*
 * WORKED EXAMPLE (computed by hand; the test asserts these figures).
 * Motor: 20 kW rated, 6000 h/yr in the register; predicted savings 10 000 kWh/yr.
 * Running threshold: 5 % × 20 kW = 1 kW.
 *
 * Baseline (hourly mean power [kW], 2026-03-02 00:00 … 11:00, comma CSV):
 *   19 21 20 20 19 21 20 20 | 0.5 0.5 0.5 0.5
 *   E_b = 160 + 4 × 0.5 = 162 kWh; running hours H_b = 8 h (mean running power 160 / 8 = 20 kW).
 * Reporting (hourly energy [kWh], 2026-06-01 00:00 … 09:00, semicolon CSV with decimal commas):
 *   17 19 18 18 17 19 | 0.5 0.5 0.5 0.5
 *   E_r = 108 + 2 = 110 kWh; H_r = 6 h (mean running power 108 / 6 = 18 kW); covered 10 h.
 *
 * Option B (10 hours of data: no complete day, so the ratio, not the daily regression):
 *   adjusted baseline = E_b / H_b × H_r = 162 / 8 × 6 = 121.5 kWh
 *   savings over the reporting period = 121.5 − 110 = 11.5 kWh
 *   annual = 11.5 × 6000 / 6 = 11 500 kWh/yr → realised 11 500 / 10 000 = 115 %
 * Uncertainty (standard errors of the mean running powers, t at 90 %):
 *   s_b² = (1+1+0+0+1+1+0+0) / 7 = 4/7, SE_b² = 4/7/8 = 0.0714286
 *   s_r² = (1+1+0+0+1+1) / 5 = 0.8,    SE_r² = 0.8/6 = 0.1333333
 *   √(SE_b² + SE_r²) = √0.2047619 = 0.452506 kW; t(12 df, two-sided 90 %) = 1.782
 *   ΔP = 1.782 × 0.452506 = 0.806366 kW → ± 0.806366 × 6 h = 4.838 kWh over the period,
 *   ± 0.806366 × 6000 h = 4838.2 kWh/yr annual.
 * Option A (power measured, hours stipulated at 6000 h/yr):
 *   annual = (20 − 18) × 6000 = 12 000 kWh/yr → realised 120 %, same ± 4838.2 kWh/yr.
 *   Over the reporting period H = 6000 × 10 / 8760 = 6.849315 h: adjusted 20 × 6.849315 = 136.986 kWh,
 *   compared 18 × 6.849315 = 123.288 kWh, savings 13.699 kWh.
 */
const WORKED_BASELINE = ['timestamp,Power [kW]', ...[19, 21, 20, 20, 19, 21, 20, 20, 0.5, 0.5, 0.5, 0.5].map((kw, hour) => `2026-03-02 ${String(hour).padStart(2, '0')}:00,${kw}`)].join('\r\n');
const WORKED_REPORTING = [
  'Zeitstempel;"Energie (kWh)"',
  ...['17,0', '19,0', '18', '18', '17', '19', '0,5', '0,5', '0,5', '0,5'].map((kwh, hour) => `01.06.2026 ${String(hour).padStart(2, '0')}:00;"${kwh}"`),
].join('\n');

describe('the worked verification example', () => {
  it('gives option B figures computed by hand (ratio on operating hours)', async () => {
    const retrofit = await installedRetrofit();
    const session = await signIn(context.app, engineer);
    const baseline = await uploadMeter(session, retrofit.id, 'baseline', WORKED_BASELINE);
    expect(baseline.status).toBe(201);
    expect(baseline.body).toMatchObject({ period: 'baseline', rows: 12, errors: [], gaps: [], unit: 'kW', register: 'interval', intervalMinutes: 60, totalKwh: 162, start: '2026-03-02T00:00:00', end: '2026-03-02T12:00:00' });
    const reporting = await uploadMeter(session, retrofit.id, 'reporting', WORKED_REPORTING);
    expect(reporting.status).toBe(201);
    expect(reporting.body).toMatchObject({ rows: 10, unit: 'kWh', totalKwh: 110, start: '2026-06-01T00:00:00' });

    const verification = (await session.get(`/api/retrofits/${retrofit.id}/verification`).expect(200)).body;
    expect(verification).toMatchObject({ ready: true, method: 'B', model: 'ratio', independentVariable: 'operating hours', thresholdKw: 1, hoursPerYear: 6000 });
    expect(verification.baseline).toMatchObject({ kwh: 162, operatingHours: 8, coveredHours: 12, meanRunningKw: 20 });
    expect(verification.reporting).toMatchObject({ kwh: 110, operatingHours: 6, coveredHours: 10, meanRunningKw: 18 });
    expect(verification.baselineKwh).toBe(162);
    expect(verification.reportingKwh).toBe(110);
    expect(verification.adjustedBaselineKwh).toBeCloseTo(121.5, 6);
    expect(verification.verifiedSavingsKwh).toBeCloseTo(11.5, 6);
    expect(verification.annualSavingsKwh).toBeCloseTo(11_500, 6);
    expect(verification.predictedSavingsKwh).toBe(10_000);
    expect(verification.realisedPct).toBeCloseTo(115, 6);
    expect(verification.uncertaintyPeriodKwh).toBeCloseTo(4.838, 2);
    expect(verification.uncertaintyKwh).toBeCloseTo(4838.2, 0);
    expect(verification.confidencePct).toBe(90);
    expect(verification.formula).toContain('(E_baseline / X_baseline) × X_reporting');
  });

  it('gives option A figures computed by hand (stipulated hours)', async () => {
    const retrofit = await installedRetrofit();
    const session = await signIn(context.app, engineer);
    await uploadMeter(session, retrofit.id, 'baseline', WORKED_BASELINE).expect(201);
    await uploadMeter(session, retrofit.id, 'reporting', WORKED_REPORTING).expect(201);
    await session.patch(`/api/retrofits/${retrofit.id}`).send({ version: retrofit.version, verificationMethod: 'A' }).expect(200);
    const verification = (await session.get(`/api/retrofits/${retrofit.id}/verification`).expect(200)).body;
    expect(verification).toMatchObject({ ready: true, method: 'A', model: 'stipulated-hours' });
    expect(verification.annualSavingsKwh).toBeCloseTo(12_000, 6);
    expect(verification.realisedPct).toBeCloseTo(120, 6);
    expect(verification.adjustedBaselineKwh).toBeCloseTo(136.986, 3);
    expect(verification.reportingComparedKwh).toBeCloseTo(123.288, 3);
    expect(verification.verifiedSavingsKwh).toBeCloseTo(13.699, 3);
    expect(verification.uncertaintyKwh).toBeCloseTo(4838.2, 0);
  });

  it('adjusts by a daily regression when the baseline has enough complete days', async () => {
    // Baseline: 8 days, h = 6, 8, 10, 12, 6, 8, 10, 12 running hours at 20 kW, else 0.5 kW:
    // daily E = 20 h + 0.5 (24 − h) = 12 + 19.5 h exactly → a = 12 kWh/day, b = 19.5 kWh/h, R² = 1.
    // Reporting: 7 days of 10 h at 18 kW: E_r = 7 × (180 + 7) = 1309 kWh, X_r = 70 h, covered 168 h.
    // Adjusted = 12 × 168/24 + 19.5 × 70 = 84 + 1365 = 1449 kWh; savings 140 kWh;
    // annual = 140 × 6000 / 70 = 12 000 kWh/yr; CV(RMSE) = 0 → uncertainty 0.
    const retrofit = await installedRetrofit();
    const session = await signIn(context.app, engineer);
    await uploadMeter(session, retrofit.id, 'baseline', dailyProfileCsv('2026-02-02', [6, 8, 10, 12, 6, 8, 10, 12], 20, 0.5)).expect(201);
    await uploadMeter(session, retrofit.id, 'reporting', dailyProfileCsv('2026-06-01', [10, 10, 10, 10, 10, 10, 10], 18, 0.5)).expect(201);
    const verification = (await session.get(`/api/retrofits/${retrofit.id}/verification`).expect(200)).body;
    expect(verification.model).toBe('regression');
    expect(verification.regression.intercept).toBeCloseTo(12, 6);
    expect(verification.regression.slope).toBeCloseTo(19.5, 6);
    expect(verification.regression.r2).toBeCloseTo(1, 6);
    expect(verification.regression.days).toBe(8);
    expect(verification.reportingKwh).toBeCloseTo(1309, 6);
    expect(verification.adjustedBaselineKwh).toBeCloseTo(1449, 3);
    expect(verification.verifiedSavingsKwh).toBeCloseTo(140, 3);
    expect(verification.annualSavingsKwh).toBeCloseTo(12_000, 1);
    expect(verification.uncertaintyKwh).toBeCloseTo(0, 3);
  });

  it('adjusts by a named independent variable (ratio on production)', async () => {
    // Baseline 4 h × 20 kWh with 10 t each: 80 kWh / 40 t = 2 kWh/t. Reporting 4 h × 18 kWh with
    // 12 t each: X_r = 48 t → adjusted 96 kWh, metered 72 kWh, savings 24 kWh;
    // annual = 24 × 8760 / 4 = 52 560 kWh/yr (calendar scaling: the variable is not hours).
    const retrofit = await installedRetrofit();
    const session = await signIn(context.app, engineer);
    const rows = (kwh: number, tonnes: number, day: string) => [0, 1, 2, 3].map((hour) => `${day} 0${hour}:00,${kwh},${tonnes}`);
    await uploadMeter(session, retrofit.id, 'baseline', ['time,kWh,Production [t]', ...rows(20, 10, '2026-03-02')].join('\n')).expect(201);
    await uploadMeter(session, retrofit.id, 'reporting', ['time,kWh,Production [t]', ...rows(18, 12, '2026-06-01')].join('\n')).expect(201);
    const before = (await session.get(`/api/retrofits/${retrofit.id}`).expect(200)).body;
    await session.patch(`/api/retrofits/${retrofit.id}`).send({ version: before.version, independentVariable: 'production [t]' }).expect(200);
    const verification = (await session.get(`/api/retrofits/${retrofit.id}/verification`).expect(200)).body;
    expect(verification).toMatchObject({ ready: true, model: 'ratio', independentVariable: 'production [t]' });
    expect(verification.adjustedBaselineKwh).toBeCloseTo(96, 6);
    expect(verification.verifiedSavingsKwh).toBeCloseTo(24, 6);
    expect(verification.annualSavingsKwh).toBeCloseTo(52_560, 3);
  });

  it('says what is missing before both periods have data', async () => {
    const retrofit = await installedRetrofit();
    const session = await signIn(context.app, engineer);
    const verification = (await session.get(`/api/retrofits/${retrofit.id}/verification`).expect(200)).body;
    expect(verification).toMatchObject({ ready: false, missing: ['baseline meter data', 'reporting meter data'], verifiedSavingsKwh: null, realisedPct: null });
  });
});

describe('meter files with problems', () => {
  it('lists every row error of a messy file and saves nothing', async () => {
    const retrofit = await installedRetrofit();
    const session = await signIn(context.app, engineer);
    await uploadMeter(session, retrofit.id, 'baseline', WORKED_BASELINE).expect(201);
    const messy = [
      'timestamp;Power [kW]',
      '2026-03-02 00:00;10',
      '2026-03-02 01:00;abc',
      '2026-03-02 02:00;-3',
      '2026-13-02 03:00;10',
      '2026-03-02 00:00;10',
      '2026-03-02 04:00+01:00;10',
      '03/02/2026 05:00;10',
      '2026-03-02 06:00;10;5',
      '2026-03-02 07:00;10',
    ].join('\n');
    const refused = await uploadMeter(session, retrofit.id, 'baseline', messy);
    expect(refused.status).toBe(400);
    expect(refused.body.error.code).toBe('meter-data-invalid');
    expect(refused.body.error.message).toBe('7 problems in the file (first: row 3, value: is not a number). Nothing was saved.');
    expect(refused.body.error.details.errors).toEqual([
      { row: 3, field: 'value', value: 'abc', message: 'is not a number' },
      { row: 4, field: 'value', value: '-3', message: 'is a negative power' },
      { row: 5, field: 'timestamp', value: '2026-13-02 03:00', message: 'is not a valid calendar date and time' },
      { row: 6, field: 'timestamp', value: '2026-03-02 00:00', message: 'duplicated timestamp (also on row 2)' },
      { row: 7, field: 'timestamp', value: '2026-03-02 04:00+01:00', message: 'mixed time zones: this row has UTC offset +01:00, row 2 has no UTC offset; export every row in one zone' },
      { row: 8, field: 'timestamp', value: '03/02/2026 05:00', message: 'has an ambiguous day/month order; write dates as YYYY-MM-DD or DD.MM.YYYY' },
      { row: 9, field: 'columns', value: '2026-03-02 06:00 | 10 | 5', message: 'has 3 fields; the header has 2' },
    ]);
    // The earlier baseline is still there, unchanged.
    const stored = (await session.get(`/api/retrofits/${retrofit.id}/meter-data`).expect(200)).body;
    expect(stored.baseline).toMatchObject({ rows: 12, totalKwh: 162 });
    expect(stored.reporting).toBeNull();
  });

  it('refuses different UTC offsets, missing units, wrong columns, negative energy and a register going backwards, each on its row', () => {
    const parse = (csv: string, register: 'interval' | 'cumulative' = 'interval') => parseMeterCsv(csv, { register }).errors;
    expect(parse('timestamp,kW\n2026-03-29T00:00+01:00,5\n2026-03-29T01:00+02:00,5')).toEqual([
      { row: 3, field: 'timestamp', value: '2026-03-29T01:00+02:00', message: 'mixed time zones: this row has UTC offset +02:00, row 2 has UTC offset +01:00; export every row in one zone' },
    ]);
    expect(parse('timestamp,value\n2026-03-02 00:00,5\n2026-03-02 01:00,6')).toEqual([
      { row: 1, field: 'unit', value: 'value', message: 'no unit: name it in the value column header ("Power [kW]", "Energy [kWh]") or choose kW or kWh for the upload' },
    ]);
    expect(parse('timestamp,value\n2026-03-02 00:00,5 kW\n2026-03-02 01:00,6\n2026-03-02 02:00,6 kWh')).toEqual([
      { row: 3, field: 'value', value: '6', message: 'has no unit (kW or kWh), and neither has the header' },
      { row: 4, field: 'value', value: '6 kWh', message: 'is in kWh, earlier rows in kW' },
    ]);
    expect(parse('Power [kW],timestamp\n5,2026-03-02 00:00')).toEqual([
      { row: 1, field: 'columns', value: 'Power [kW]', message: 'the first row must be a header whose first column is the timestamp (e.g. "timestamp;Power [kW]")' },
    ]);
    expect(parse('timestamp,kW,a,b\n2026-03-02 00:00,5,1,2')[0]).toMatchObject({ row: 1, field: 'columns', message: 'has 4 columns; expected a timestamp, a value in kW or kWh, and at most one independent variable' });
    expect(parse('timestamp,Energy [kWh]\n2026-03-02 00:00,5\n2026-03-02 01:00,-1\n2026-03-02 02:00,4')).toEqual([{ row: 3, field: 'value', value: '-1', message: 'is a negative energy' }]);
    expect(parse('timestamp,Counter [kWh]\n2026-03-02 00:00,100\n2026-03-02 01:00,110\n2026-03-02 02:00,105\n2026-03-02 03:00,120', 'cumulative')).toEqual([
      { row: 4, field: 'value', value: '105', message: 'the cumulative register goes backwards (from 110 on row 3)' },
    ]);
    expect(parse('timestamp,Power [kW]\n2026-03-02 00:00,100\n2026-03-02 01:00,110', 'cumulative')).toEqual([
      { row: 1, field: 'unit', value: 'Power [kW]', message: 'a cumulative register counts energy: its unit must be kWh' },
    ]);
  });

  it('reports gaps with their start and end and does not fill them', async () => {
    const retrofit = await installedRetrofit();
    const session = await signIn(context.app, engineer);
    const csv = ['timestamp,Power [kW]', '2026-03-02 00:00,10', '2026-03-02 01:00,10', '2026-03-02 02:00,10', '2026-03-02 03:00,10', '2026-03-02 06:00,10', '2026-03-02 07:00,10'].join('\n');
    const uploaded = await uploadMeter(session, retrofit.id, 'baseline', csv).expect(201);
    // Six readings of 10 kW for one hour each: 60 kWh; the two missing hours (04:00–06:00) add nothing.
    expect(uploaded.body).toMatchObject({ rows: 6, totalKwh: 60, gaps: [{ start: '2026-03-02T04:00:00', end: '2026-03-02T06:00:00', hours: 2, afterRow: 5 }] });
    const stored = (await session.get(`/api/retrofits/${retrofit.id}/meter-data`).expect(200)).body;
    // The chart series breaks at the gap (a null point) instead of drawing a line across it.
    expect(stored.baseline.series).toContainEqual([Date.parse('2026-03-02T04:00:00Z'), null]);
    expect(stored.baseline.coveredHours).toBe(6);
  });

  it('reads a cumulative register as differences of readings, leaving out a difference across a gap', () => {
    const parsed = parseMeterCsv('timestamp,Meter [kWh]\n2026-03-02 00:00,1000\n2026-03-02 00:15,1005\n2026-03-02 00:30,1010\n2026-03-02 01:30,1040\n2026-03-02 01:45,1045', { register: 'cumulative' });
    expect(parsed.errors).toEqual([]);
    expect(parsed.intervalMinutes).toBe(15);
    expect(parsed.points.map((point) => point[2])).toEqual([5, 5, 5]);
    expect(parsed.gaps).toEqual([{ start: '2026-03-02T00:30:00', end: '2026-03-02T01:30:00', hours: 1, afterRow: 4 }]);
  });

  it('reads decimal commas, thousands marks and quoted fields', () => {
    expect(parseDecimal('12,5')).toBe(12.5);
    expect(parseDecimal('1.234,5')).toBe(1234.5);
    expect(parseDecimal('1,234.5')).toBe(1234.5);
    expect(parseDecimal('1 234,5')).toBe(1234.5);
    expect(parseDecimal('12.5.')).toBeNull();
    expect(parseDecimal('abc')).toBeNull();
    const parsed = parseMeterCsv('"Time stamp";"Power; mean [kW]"\n"2026-03-02 00:00";"1,5"\n"2026-03-02 00:30";"2,5"', { register: 'interval' });
    expect(parsed.errors).toEqual([]);
    expect(parsed.points.map((point) => point[2])).toEqual([0.75, 1.25]);
  });

  it('uses the Student t of the standard table (two-sided 90 %)', () => {
    // Standard t table, value from memory: t(0.95; 12) = 1.782, t(0.95; 30) = 1.697, t(0.95; ∞) = 1.645.
    expect(studentT90(12)).toBeCloseTo(1.782, 3);
    expect(studentT90(30)).toBeCloseTo(1.697, 3);
    expect(studentT90(1000)).toBeCloseTo(1.645, 3);
  });

  it('replaces a period atomically, takes the unit override, and refuses reporting data before installation', async () => {
    const retrofit = await installedRetrofit();
    const session = await signIn(context.app, engineer);
    await uploadMeter(session, retrofit.id, 'baseline', WORKED_BASELINE).expect(201);
    const replaced = await uploadMeter(session, retrofit.id, 'baseline', 'timestamp,value\n2026-03-03 00:00,4\n2026-03-03 01:00,4', { unit: 'kWh', scope: 'feeder' }).expect(201);
    expect(replaced.body).toMatchObject({ rows: 2, unit: 'kWh', scope: 'feeder', totalKwh: 8 });
    const stored = (await session.get(`/api/retrofits/${retrofit.id}/meter-data`).expect(200)).body;
    expect(stored.baseline).toMatchObject({ rows: 2, totalKwh: 8, start: '2026-03-03T00:00:00' });

    const motor = await createMotor(organization, site);
    const ordered = await createRetrofitRow(organization, motor, engineer.id, { status: 'ordered' });
    const early = await uploadMeter(session, ordered.id, 'reporting', WORKED_REPORTING);
    expect(early.status).toBe(409);
    expect(early.body.error.code).toBe('reporting-before-installation');
    await uploadMeter(session, ordered.id, 'baseline', WORKED_BASELINE).expect(201);
    const badPeriod = await uploadMeter(session, ordered.id, 'before' as 'baseline', WORKED_BASELINE);
    expect(badPeriod.body.error.message).toBe('period: must be baseline or reporting');
    const binary = await session.post(`/api/retrofits/${ordered.id}/meter-data`).field('period', 'baseline').attach('file', Buffer.from('%PDF-1.4\n%%EOF'), 'meter.csv');
    expect(binary.status).toBe(415);
  });
});
