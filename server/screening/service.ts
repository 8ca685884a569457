/** Screening jobs of a site, job status, and retrofit proposals made from a screening's rows. */
import { Op, type WhereOptions } from 'sequelize';
import { database } from '../lib/database.js';
import { badRequest, conflict } from '../lib/errors.js';
import { orderFrom, pageWindow } from '../lib/lists.js';
import type { Tenant } from '../lib/tenant.js';
import { enqueueJob } from '../jobs/runner.js';
import { Job, Motor, Retrofit, Site } from '../models/index.js';
import type { ListResult } from '../shared/common.js';
import type { JobOutput, RetrofitListQuery, RetrofitOutput, ScreeningResult, ScreeningStart } from '../shared/screening.js';
import type { ScreeningParams } from './job.js';

export async function startScreening(tenant: Tenant, siteId: number, body: ScreeningStart): Promise<{ jobId: number }> {
  const site = await tenant.findById(Site, siteId, 'Site');
  const params: ScreeningParams = { siteId: site.id, rankBy: body.rankBy };
  if (body.budget !== undefined) params.budget = body.budget;
  if (body.filters !== undefined) params.filters = body.filters;
  const job = await database().transaction(async (transaction) => {
    const created = await enqueueJob(
      { organizationId: tenant.organizationId, kind: 'screening', params: params as unknown as Record<string, unknown>, createdBy: tenant.user.id },
      transaction,
    );
    await tenant.audit('start', 'screening', created.id, params as unknown as Record<string, unknown>, transaction);
    return created;
  });
  return { jobId: job.id };
}

function jobToOutput(job: Job): JobOutput {
  return {
    id: job.id,
    kind: job.kind,
    status: job.status,
    progress: job.progress,
    result: job.result ?? null,
    error: job.error ?? null,
    params: job.params,
    createdById: job.createdBy,
    createdAt: job.createdAt.toISOString(),
    startedAt: job.startedAt?.toISOString() ?? null,
    finishedAt: job.finishedAt?.toISOString() ?? null,
  };
}

export async function getJob(tenant: Tenant, id: number): Promise<JobOutput> {
  return jobToOutput(await tenant.findById(Job, id, 'Job'));
}

/** Cancels a queued or running job (a running one stops at its next progress report). */
export async function cancelJob(tenant: Tenant, id: number): Promise<JobOutput> {
  await database().transaction(async (transaction) => {
    const job = await tenant.findById(Job, id, 'Job', { transaction, lock: transaction.LOCK.UPDATE });
    if (job.status !== 'queued' && job.status !== 'running') throw conflict('job-finished', `The job is already ${job.status}.`);
    await job.update({ status: 'cancelled', finishedAt: new Date(), lockedBy: null }, { transaction });
    await tenant.audit('cancel', 'job', id, null, transaction);
  });
  return getJob(tenant, id);
}

const money = (value: string | number) => Number(value);

async function retrofitOutputs(tenant: Tenant, rows: Retrofit[]): Promise<RetrofitOutput[]> {
  const motorIds = [...new Set(rows.map((row) => row.motorId))];
  const motors = motorIds.length === 0 ? [] : await tenant.findAll(Motor, { where: { id: { [Op.in]: motorIds } }, attributes: ['id', 'tag', 'siteId', 'organizationId'] });
  const byId = new Map(motors.map((motor) => [motor.id, motor]));
  const siteIds = [...new Set(motors.map((motor) => motor.siteId))];
  const sites = siteIds.length === 0 ? [] : await tenant.findAll(Site, { where: { id: { [Op.in]: siteIds } }, attributes: ['id', 'name', 'organizationId'] });
  const siteNames = new Map(sites.map((site) => [site.id, site.name]));
  return rows.map((row) => {
    const motor = byId.get(row.motorId);
    return {
      id: row.id,
      motorId: row.motorId,
      motorTag: motor?.tag ?? '',
      siteId: motor?.siteId ?? 0,
      siteName: motor ? (siteNames.get(motor.siteId) ?? '') : '',
      optionCode: row.optionCode,
      status: row.status,
      source: row.source,
      jobId: row.jobId,
      predictedSavingsKwh: row.predictedSavingsKwh,
      predictedSavingsCost: money(row.predictedSavingsCost),
      capex: money(row.capex),
      npv: money(row.npv),
      currency: row.currency,
      createdById: row.createdBy,
      createdAt: row.createdAt.toISOString(),
      version: row.version,
    };
  });
}

/**
 * Turns rows of a finished screening into retrofit proposals (status `proposed`) with the row's
 * predicted figures. A motor already proposed from the same screening is not proposed twice.
 */
export async function createProposals(tenant: Tenant, jobId: number, motorIds: number[]) {
  const job = await tenant.findById(Job, jobId, 'Screening');
  if (job.kind !== 'screening') throw badRequest('jobId: is not a screening job', [{ field: 'jobId', message: 'is not a screening job' }]);
  if (job.status !== 'done') throw conflict('job-not-done', `The screening is ${job.status}; proposals need a finished screening.`);
  const result = job.result as ScreeningResult;
  const rows = new Map(result.rows.map((row) => [row.motorId, row]));
  motorIds.forEach((motorId, index) => {
    const row = rows.get(motorId);
    if (!row) throw badRequest(`motorIds.${index}: motor ${motorId} is not in this screening`, [{ field: `motorIds.${index}`, message: 'is not in this screening' }]);
    if (row.optionCode === null) throw badRequest(`motorIds.${index}: motor ${row.tag} has no option that pays`, [{ field: `motorIds.${index}`, message: 'has no option that pays' }]);
  });
  const unique = [...new Set(motorIds)];
  const { created, existing } = await database().transaction(async (transaction) => {
    const already = await tenant.findAll(Retrofit, { where: { jobId, motorId: { [Op.in]: unique } }, transaction });
    const proposed = new Set(already.map((retrofit) => retrofit.motorId));
    // Motors deleted since the screening ran cannot be proposed.
    const living = new Set((await tenant.findAll(Motor, { where: { id: { [Op.in]: unique } }, attributes: ['id', 'organizationId'], transaction })).map((motor) => motor.id));
    const fresh: Retrofit[] = [];
    for (const motorId of unique) {
      if (proposed.has(motorId)) continue;
      if (!living.has(motorId)) throw badRequest(`motorIds: motor ${motorId} no longer exists`, [{ field: 'motorIds', message: `motor ${motorId} no longer exists` }]);
      const row = rows.get(motorId)!;
      fresh.push(
        await tenant.create(
          Retrofit,
          {
            motorId,
            optionCode: row.optionCode!,
            source: 'screening',
            jobId,
            predictedSavingsKwh: row.annualKwhSaved,
            predictedSavingsCost: String(row.costSaved),
            capex: String(row.capex),
            npv: String(row.npv),
            currency: result.currency,
            createdBy: tenant.user.id,
          },
          transaction,
        ),
      );
    }
    if (fresh.length > 0) await tenant.audit('propose', 'retrofit', null, { jobId, motorIds: fresh.map((r) => r.motorId) }, transaction);
    return { created: fresh, existing: already };
  });
  return { items: await retrofitOutputs(tenant, [...created, ...existing]), created: created.length, alreadyProposed: existing.length };
}

export async function listRetrofits(tenant: Tenant, query: RetrofitListQuery): Promise<ListResult<RetrofitOutput>> {
  const where: WhereOptions<Retrofit> = {};
  if (query.status) Object.assign(where, { status: query.status });
  if (query.motorId !== undefined) Object.assign(where, { motorId: query.motorId });
  if (query.siteId !== undefined) {
    const motors = await tenant.findAll(Motor, { where: { siteId: query.siteId }, attributes: ['id', 'organizationId'] });
    Object.assign(where, { motorId: { [Op.in]: motors.map((motor) => motor.id) } });
    if (query.motorId !== undefined) Object.assign(where, { motorId: motors.some((m) => m.id === query.motorId) ? query.motorId : -1 });
  }
  const { rows, count } = await tenant.findAndCountAll(Retrofit, { where, order: orderFrom(query.sort), ...pageWindow(query.page, query.pageSize) });
  return { items: await retrofitOutputs(tenant, rows), total: count, page: query.page, pageSize: query.pageSize };
}
