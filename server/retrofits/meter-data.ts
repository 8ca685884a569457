/**
 * Meter data of a retrofit's baseline and reporting periods, and the verification computed from it.
 *
 * Decisions documented here:
 * - A file with any row error is refused as a whole (400 'meter-data-invalid', the rows, errors and
 *   gaps in `details`); the stored data stay as they were. Dropping bad rows would leave holes the
 *   user did not choose, and M&V figures must rest on data someone looked at.
 * - A new upload of a period replaces that period's data in one transaction.
 * - Baseline data (historic by nature) may be uploaded in any open status; reporting data once it is
 *   installed (the reporting period follows the installation). A verified or rejected retrofit is
 *   closed (409 'retrofit-closed').
 */
import { Op, type Transaction } from 'sequelize';
import { database } from '../lib/database.js';
import { AppError, conflict } from '../lib/errors.js';
import type { Tenant } from '../lib/tenant.js';
import { sniffType } from '../lib/uploads.js';
import { Motor, Retrofit, RetrofitMeterData, Site } from '../models/index.js';
import type { MeterDataOutput, MeterPeriodOutput, MeterUploadFields, MeterUploadResult, MeterRowError, VerificationOutput, VerificationSummary } from '../shared/retrofit.js';
import { parseMeterCsv, wallIso } from './meter-csv.js';
import { verifySavings, type PeriodData } from './verification.js';

/** Largest meter file [bytes]. */
export const METER_FILE_MAX_BYTES = 30 * 1024 * 1024;
/** The error list of a refused file is cut here (the message gives the full count). */
const MAX_LISTED_ERRORS = 500;
/** The chart series is averaged down to about this many points. */
const MAX_SERIES_POINTS = 3000;

function decode(buffer: Buffer): string {
  const text = buffer.toString('utf8');
  // Not UTF-8: meter software on older PCs writes Windows-1252, close enough to Latin-1 for headers.
  return text.includes('\ufffd') ? buffer.toString('latin1') : text;
}

function periodTotals(points: RetrofitMeterData['points']) {
  let kwh = 0;
  let hours = 0;
  for (const point of points) {
    kwh += point[2];
    hours += point[1];
  }
  return { kwh, hours };
}

export async function uploadMeterData(
  tenant: Tenant,
  retrofitId: number,
  upload: { buffer: Buffer; originalname: string },
  fields: MeterUploadFields,
): Promise<MeterUploadResult> {
  const retrofit = await tenant.findById(Retrofit, retrofitId, 'Retrofit');
  checkPeriodOpen(retrofit.status, fields.period);
  if (sniffType(upload.buffer) !== 'text/plain') {
    throw new AppError('unsupported-file', 'file: meter data must be a CSV text file', 415, [{ field: 'file', message: 'must be a CSV text file' }]);
  }
  const parsed = parseMeterCsv(decode(upload.buffer), { unit: fields.unit, register: fields.register });
  if (parsed.errors.length > 0) {
    const count = parsed.errors.length;
    const first = parsed.errors[0]!;
    const errors: MeterRowError[] = parsed.errors.slice(0, MAX_LISTED_ERRORS);
    throw new AppError(
      'meter-data-invalid',
      `${count} problem${count === 1 ? '' : 's'} in the file (first: row ${first.row}, ${first.field}: ${first.message})${count > MAX_LISTED_ERRORS ? `; the first ${MAX_LISTED_ERRORS} are listed` : ''}. Nothing was saved.`,
      400,
      { rows: parsed.rows, errors, errorCount: count, gaps: parsed.gaps },
    );
  }
  const stored = await database().transaction(async (transaction) => {
    const locked = await tenant.findById(Retrofit, retrofitId, 'Retrofit', { transaction, lock: transaction.LOCK.UPDATE });
    checkPeriodOpen(locked.status, fields.period);
    await RetrofitMeterData.destroy({ where: tenant.where<RetrofitMeterData>({ retrofitId, period: fields.period }), transaction });
    const created = await tenant.create(
      RetrofitMeterData,
      {
        retrofitId,
        period: fields.period,
        unit: parsed.unit!,
        register: fields.register,
        scope: fields.scope,
        fileName: upload.originalname.split(/[\\/]/).pop()?.slice(0, 255) || 'meter.csv',
        variableName: parsed.variableName,
        utcOffset: parsed.utcOffset,
        intervalMinutes: parsed.intervalMinutes,
        rows: parsed.rows,
        points: parsed.points,
        gaps: parsed.gaps,
        userId: tenant.user.id,
      },
      transaction,
    );
    await tenant.audit('meter-data', 'retrofit', retrofitId, { period: fields.period, rows: parsed.rows, gaps: parsed.gaps.length, fileName: created.fileName }, transaction);
    return created;
  });
  return { ...summaryOf(stored), errors: [] };
}

function checkPeriodOpen(status: Retrofit['status'], period: 'baseline' | 'reporting'): void {
  if (status === 'verified' || status === 'rejected') throw conflict('retrofit-closed', `The retrofit is ${status}; its meter data can no longer change.`);
  if (period === 'reporting' && status !== 'installed') {
    throw conflict('reporting-before-installation', `Reporting-period data follow the installation; this retrofit is ${status}. Record the installation first.`);
  }
}

function summaryOf(row: RetrofitMeterData): Omit<MeterUploadResult, 'errors'> {
  const first = row.points[0];
  const last = row.points[row.points.length - 1];
  return {
    period: row.period,
    rows: row.rows,
    gaps: row.gaps,
    unit: row.unit,
    register: row.register,
    scope: row.scope,
    intervalMinutes: row.intervalMinutes,
    variableName: row.variableName,
    utcOffset: row.utcOffset,
    start: first ? wallIso(first[0]) : '',
    end: last ? wallIso(last[0] + last[1] * 3_600_000) : '',
    totalKwh: Math.round(periodTotals(row.points).kwh * 1000) / 1000,
  };
}

/** Mean power per interval [kW] with a null after each break, averaged down for the chart. */
export function chartSeries(points: RetrofitMeterData['points']): Array<[number, number | null]> {
  const bucket = Math.max(1, Math.ceil(points.length / MAX_SERIES_POINTS));
  const series: Array<[number, number | null]> = [];
  for (let index = 0; index < points.length; index += bucket) {
    const group = points.slice(index, index + bucket);
    let kwh = 0;
    let hours = 0;
    let broken = false;
    for (let inner = 0; inner < group.length; inner += 1) {
      const point = group[inner]!;
      kwh += point[2];
      hours += point[1];
      const next = points[index + inner + 1];
      if (next && next[0] > point[0] + point[1] * 3_600_000 + 1000) broken = true;
    }
    const last = group[group.length - 1]!;
    series.push([group[0]![0], hours > 0 ? Math.round((kwh / hours) * 1000) / 1000 : null]);
    if (broken) series.push([last[0] + last[1] * 3_600_000, null]);
  }
  return series;
}

export async function getMeterData(tenant: Tenant, retrofitId: number): Promise<MeterDataOutput> {
  await tenant.findById(Retrofit, retrofitId, 'Retrofit');
  const rows = await tenant.findAll(RetrofitMeterData, { where: { retrofitId } });
  const output = (period: 'baseline' | 'reporting'): MeterPeriodOutput | null => {
    const row = rows.find((entry) => entry.period === period);
    if (!row) return null;
    return { ...summaryOf(row), fileName: row.fileName, uploadedAt: row.createdAt.toISOString(), coveredHours: Math.round(periodTotals(row.points).hours * 1000) / 1000, series: chartSeries(row.points) };
  };
  return { baseline: output('baseline'), reporting: output('reporting') };
}

/** The verification of a retrofit from its stored meter data (see verification.ts). */
export async function computeVerification(tenant: Tenant, retrofit: Retrofit, transaction?: Transaction): Promise<VerificationOutput> {
  const options = transaction ? { transaction } : {};
  const motor = await tenant.findById(Motor, retrofit.motorId, 'Motor', options);
  const data = await tenant.findAll(RetrofitMeterData, { where: { retrofitId: retrofit.id }, ...options });
  const period = (name: 'baseline' | 'reporting'): PeriodData | null => {
    const row = data.find((entry) => entry.period === name);
    return row ? { points: row.points, scope: row.scope, variableName: row.variableName, gaps: row.gaps.length } : null;
  };
  return verifySavings({
    retrofitId: retrofit.id,
    method: retrofit.verificationMethod ?? 'B',
    independentVariable: retrofit.independentVariable ?? null,
    ratedPowerKw: motor.ratedPowerKw,
    hoursPerYear: retrofit.stipulatedHoursPerYear ?? motor.hoursPerYear ?? null,
    predictedSavingsKwh: retrofit.predictedSavingsKwh,
    baseline: period('baseline'),
    reporting: period('reporting'),
  });
}

export async function getVerification(tenant: Tenant, retrofitId: number): Promise<VerificationOutput> {
  return computeVerification(tenant, await tenant.findById(Retrofit, retrofitId, 'Retrofit'));
}

/**
 * Realised against predicted per site and for the organisation, over the retrofits installed or
 * verified: a verified retrofit counts with its frozen figures, an installed one with its current
 * verification when ready. Uncertainties add in quadrature (independent meters).
 */
export async function verificationSummary(tenant: Tenant, siteId: number | undefined): Promise<VerificationSummary> {
  const sites = await tenant.findAll(Site, siteId === undefined ? { order: [['name', 'ASC']] } : { where: { id: siteId } });
  if (siteId !== undefined && sites.length === 0) await tenant.findById(Site, siteId, 'Site');
  const motors = await tenant.findAll(Motor, { where: { siteId: { [Op.in]: sites.map((site) => site.id) } }, attributes: ['id', 'siteId', 'organizationId'] });
  const siteOfMotor = new Map(motors.map((motor) => [motor.id, motor.siteId]));
  const retrofits = await tenant.findAll(Retrofit, { where: { motorId: { [Op.in]: [...siteOfMotor.keys()] }, status: { [Op.in]: ['installed', 'verified'] } } });
  const blank = () => ({ retrofits: 0, verifiable: 0, predictedSavingsKwh: 0, verifiedSavingsKwh: 0, predictedOfVerifiedKwh: 0, realisedPct: null as number | null, uncertaintyKwh: null as number | null, variance: 0, anyUncertainty: false });
  const bySite = new Map(sites.map((site) => [site.id, blank()]));
  const organization = blank();
  for (const retrofit of retrofits) {
    let savings: number | null = null;
    let uncertainty: number | null = null;
    if (retrofit.status === 'verified' && retrofit.verifiedSavingsKwh != null) {
      savings = retrofit.verifiedSavingsKwh;
      uncertainty = retrofit.verifiedUncertaintyKwh ?? null;
    } else {
      const verification = await computeVerification(tenant, retrofit);
      if (verification.ready) {
        savings = verification.annualSavingsKwh;
        uncertainty = verification.uncertaintyKwh;
      }
    }
    for (const figures of [bySite.get(siteOfMotor.get(retrofit.motorId)!)!, organization]) {
      figures.retrofits += 1;
      figures.predictedSavingsKwh += retrofit.predictedSavingsKwh;
      if (savings === null) continue;
      figures.verifiable += 1;
      figures.verifiedSavingsKwh += savings;
      figures.predictedOfVerifiedKwh += retrofit.predictedSavingsKwh;
      if (uncertainty !== null) {
        figures.variance += uncertainty ** 2;
        figures.anyUncertainty = true;
      }
    }
  }
  const finish = (figures: ReturnType<typeof blank>) => ({
    retrofits: figures.retrofits,
    verifiable: figures.verifiable,
    predictedSavingsKwh: Math.round(figures.predictedSavingsKwh * 10) / 10,
    verifiedSavingsKwh: Math.round(figures.verifiedSavingsKwh * 10) / 10,
    predictedOfVerifiedKwh: Math.round(figures.predictedOfVerifiedKwh * 10) / 10,
    realisedPct: figures.predictedOfVerifiedKwh > 0 ? Math.round((figures.verifiedSavingsKwh / figures.predictedOfVerifiedKwh) * 10000) / 100 : null,
    uncertaintyKwh: figures.anyUncertainty ? Math.round(Math.sqrt(figures.variance) * 10) / 10 : null,
  });
  return {
    sites: sites.map((site) => ({ siteId: site.id, siteName: site.name, ...finish(bySite.get(site.id)!) })),
    organization: finish(organization),
  };
}
