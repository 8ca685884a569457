/**
 * The Retrofit log: proposals, the workflow's transitions (with their history and e-mails), the
 * retrofit's data, and the list with its overdue flags. Meter data, verification and files live in
 * their own modules of this component.
 *
 * Decisions documented here:
 * - A transition is checked for the role first, by its target (TRANSITION_ROLES: a role that may
 *   never move a retrofit INTO that status gets 403), then for the workflow (RETROFIT_TRANSITIONS:
 *   a move the workflow does not allow from the current status gets 409 'transition-not-allowed').
 * - Approvers alone approve and reject (as for business cases); they change nothing else (403 for
 *   data fields). Engineers and admins edit the data in any status but rejected and verified, where
 *   only the notes stay editable (409 'retrofit-closed').
 * - 'ordered' and 'installed' record their date (today unless given); 'verified' needs a ready
 *   verification and freezes its annual savings and uncertainty on the retrofit (the Overview reads them).
 * - E-mails go after the commit; a mail failure is logged and does not undo the transition.
 */
import { Op, type Transaction, type WhereOptions } from 'sequelize';
import { database } from '../lib/database.js';
import { conflict, forbidden, staleVersion } from '../lib/errors.js';
import { orderFrom, pageWindow } from '../lib/lists.js';
import { logger } from '../lib/logger.js';
import type { Mailer } from '../lib/mail.js';
import type { Tenant } from '../lib/tenant.js';
import { Motor, Retrofit, RetrofitEvent, RetrofitFile, Site, User } from '../models/index.js';
import type { ListResult } from '../shared/common.js';
import type { Role } from '../shared/roles.js';
import {
  PROPOSAL_DECISION_DAYS,
  RETROFIT_DATA_FIELDS,
  RETROFIT_TRANSITIONS,
  TRANSITION_ROLES,
  allowedTransitions,
  type InstalledEquipment,
  type RetrofitCreate,
  type RetrofitDetail,
  type RetrofitLogItem,
  type RetrofitLogQuery,
  type RetrofitPatch,
  type RetrofitStatus,
} from '../shared/retrofit.js';
import { toFileOutput } from './files.js';
import { computeVerification } from './meter-data.js';

const DAY_MS = 86_400_000;
const money = (value: string | number | null) => (value === null ? null : Number(value));
const today = () => new Date().toISOString().slice(0, 10);

/** Whether a retrofit is overdue, and why (see PROPOSAL_DECISION_DAYS). */
export function overdueOf(row: Retrofit, now = new Date()): { overdue: boolean; reason: string | null } {
  const date = now.toISOString().slice(0, 10);
  if (row.status === 'ordered' && row.expectedInstallationDate && row.expectedInstallationDate < date) {
    return { overdue: true, reason: `installation was due on ${row.expectedInstallationDate}` };
  }
  if (row.status === 'proposed') {
    const since = row.statusChangedAt ?? row.createdAt;
    const days = Math.floor((now.getTime() - since.getTime()) / DAY_MS);
    if (days > PROPOSAL_DECISION_DAYS) return { overdue: true, reason: `waiting ${days} days for a decision (more than ${PROPOSAL_DECISION_DAYS})` };
  }
  return { overdue: false, reason: null };
}

function overdueWhere(): WhereOptions {
  const limit = new Date(Date.now() - PROPOSAL_DECISION_DAYS * DAY_MS);
  return {
    [Op.or]: [
      { status: 'ordered', expectedInstallationDate: { [Op.lt]: today() } },
      { status: 'proposed', [Op.or]: [{ statusChangedAt: { [Op.lt]: limit } }, { statusChangedAt: null, createdAt: { [Op.lt]: limit } }] },
    ],
  };
}

async function motorsAndSites(tenant: Tenant, motorIds: number[], transaction?: Transaction) {
  const motors = motorIds.length === 0 ? [] : await tenant.findAll(Motor, { where: { id: { [Op.in]: motorIds } }, ...(transaction ? { transaction } : {}) });
  const siteIds = [...new Set(motors.map((motor) => motor.siteId))];
  const sites = siteIds.length === 0 ? [] : await tenant.findAll(Site, { where: { id: { [Op.in]: siteIds } }, attributes: ['id', 'name', 'organizationId'] });
  return { motors: new Map(motors.map((motor) => [motor.id, motor])), siteNames: new Map(sites.map((site) => [site.id, site.name])) };
}

export async function toLogItems(tenant: Tenant, rows: Retrofit[]): Promise<RetrofitLogItem[]> {
  const { motors, siteNames } = await motorsAndSites(tenant, [...new Set(rows.map((row) => row.motorId))]);
  return rows.map((row) => {
    const motor = motors.get(row.motorId);
    const overdue = overdueOf(row);
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
      predictedSavingsCost: Number(row.predictedSavingsCost),
      capex: Number(row.capex),
      npv: Number(row.npv),
      currency: row.currency,
      createdById: row.createdBy,
      createdAt: row.createdAt.toISOString(),
      version: row.version,
      orderDate: row.orderDate ?? null,
      expectedInstallationDate: row.expectedInstallationDate ?? null,
      installationDate: row.installationDate ?? null,
      actualCapex: money(row.actualCapex ?? null),
      rebateReceived: money(row.rebateReceived ?? null),
      statusChangedAt: row.statusChangedAt?.toISOString() ?? null,
      overdue: overdue.overdue,
      overdueReason: overdue.reason,
      verificationMethod: row.verificationMethod ?? 'B',
      verifiedSavingsKwh: row.verifiedSavingsKwh ?? null,
      verifiedUncertaintyKwh: row.verifiedUncertaintyKwh ?? null,
    } as RetrofitLogItem;
  });
}

/** `GET /api/retrofits`: the screening's list (filters status, siteId, motorId) plus overdue flags and filter. */
export async function listRetrofitLog(tenant: Tenant, query: RetrofitLogQuery): Promise<ListResult<RetrofitLogItem>> {
  const conditions: WhereOptions[] = [];
  if (query.status) conditions.push({ status: query.status });
  if (query.motorId !== undefined) conditions.push({ motorId: query.motorId });
  if (query.siteId !== undefined) {
    const motors = await tenant.findAll(Motor, { where: { siteId: query.siteId }, attributes: ['id', 'organizationId'] });
    conditions.push({ motorId: { [Op.in]: motors.map((motor) => motor.id) } });
  }
  if (query.overdue === 'true') conditions.push(overdueWhere());
  if (query.overdue === 'false') conditions.push({ [Op.not]: overdueWhere() });
  const where = (conditions.length === 0 ? {} : { [Op.and]: conditions }) as WhereOptions<Retrofit>;
  const { rows, count } = await tenant.findAndCountAll(Retrofit, { where, order: orderFrom(query.sort), ...pageWindow(query.page, query.pageSize) });
  return { items: await toLogItems(tenant, rows), total: count, page: query.page, pageSize: query.pageSize };
}

async function userNames(ids: Array<number | null>): Promise<Map<number, string>> {
  const wanted = [...new Set(ids.filter((id): id is number => id !== null))];
  if (wanted.length === 0) return new Map();
  const users = await User.findAll({ where: { id: { [Op.in]: wanted } }, attributes: ['id', 'name'] });
  return new Map(users.map((user) => [user.id, user.name]));
}

/** `GET /api/retrofits/:id`: the retrofit with its motor, history, files and what the user may do next. */
export async function getRetrofit(tenant: Tenant, id: number): Promise<RetrofitDetail> {
  const row = await tenant.findById(Retrofit, id, 'Retrofit');
  const [item] = await toLogItems(tenant, [row]);
  const motor = await tenant.findById(Motor, row.motorId, 'Motor');
  const events = await tenant.findAll(RetrofitEvent, { where: { retrofitId: id }, order: [['createdAt', 'ASC'], ['id', 'ASC']] });
  const files = await tenant.findAll(RetrofitFile, { where: { retrofitId: id }, order: [['createdAt', 'DESC'], ['id', 'DESC']] });
  const names = await userNames([row.createdBy, ...events.map((event) => event.userId)]);
  return {
    ...item!,
    installedEquipment: (row.installedEquipment ?? null) as InstalledEquipment | null,
    notes: row.notes ?? null,
    independentVariable: row.independentVariable ?? null,
    stipulatedHoursPerYear: row.stipulatedHoursPerYear ?? null,
    createdByName: row.createdBy === null ? null : (names.get(row.createdBy) ?? null),
    motor: {
      id: motor.id,
      tag: motor.tag,
      description: motor.description,
      ratedPowerKw: motor.ratedPowerKw,
      efficiencyClass: motor.efficiencyClass,
      frame: motor.frame,
      hoursPerYear: motor.hoursPerYear,
      application: motor.application,
    },
    allowedTransitions: allowedTransitions(row.status, tenant.user.role),
    events: events.map((event) => ({
      id: event.id,
      fromStatus: event.fromStatus,
      toStatus: event.toStatus,
      userId: event.userId,
      userName: event.userId === null ? null : (names.get(event.userId) ?? null),
      comment: event.comment,
      createdAt: event.createdAt.toISOString(),
    })),
    files: files.map(toFileOutput),
  };
}

/** `POST /api/retrofits`: an engineer proposes a retrofit of one motor; the approvers are told. */
export async function createRetrofit(tenant: Tenant, mailer: Mailer, publicUrl: string, body: RetrofitCreate): Promise<RetrofitDetail> {
  const row = await database().transaction(async (transaction) => {
    const motor = await tenant.findById(Motor, body.motorId, 'Motor', { transaction });
    if (motor.status === 'retired') throw conflict('motor-retired', `Motor ${motor.tag} is retired; a retired motor cannot be retrofitted.`);
    const open = await tenant.findAll(Retrofit, { where: { motorId: motor.id, status: { [Op.in]: ['proposed', 'approved', 'ordered'] } }, transaction });
    if (open.length > 0) {
      throw conflict('retrofit-open', `Motor ${motor.tag} already has an open retrofit (#${open[0]!.id}, ${open[0]!.status}); continue that one.`, [{ field: 'motorId', message: 'has an open retrofit' }]);
    }
    const site = await tenant.findById(Site, motor.siteId, 'Site', { transaction });
    const created = await tenant.create(
      Retrofit,
      {
        motorId: motor.id,
        optionCode: body.optionCode,
        source: 'manual',
        jobId: null,
        predictedSavingsKwh: body.predictedSavingsKwh,
        predictedSavingsCost: String(body.predictedSavingsCost),
        capex: String(body.capex),
        npv: '0',
        currency: site.currency,
        createdBy: tenant.user.id,
        notes: body.notes ?? null,
        statusChangedAt: new Date(),
      },
      transaction,
    );
    await tenant.create(RetrofitEvent, { retrofitId: created.id, fromStatus: null, toStatus: 'proposed', userId: tenant.user.id, comment: body.comment ?? null }, transaction);
    await tenant.audit('propose', 'retrofit', created.id, { motorId: motor.id, optionCode: body.optionCode }, transaction);
    return created;
  });
  await notifyTransition(tenant, mailer, publicUrl, row, null, 'proposed', body.comment ?? null);
  return getRetrofit(tenant, row.id);
}

function checkTransition(from: RetrofitStatus, to: RetrofitStatus, role: Role): void {
  if (!TRANSITION_ROLES[to].includes(role)) {
    const who = TRANSITION_ROLES[to].map((allowed) => `${allowed}s`).join(' and ');
    throw forbidden(`Only ${who} may move a retrofit to ${to}.`);
  }
  if (!RETROFIT_TRANSITIONS[from].includes(to)) {
    const next = RETROFIT_TRANSITIONS[from];
    throw conflict('transition-not-allowed', `A retrofit cannot go from ${from} to ${to}; from ${from} it can go to ${next.length > 0 ? next.join(' or ') : 'nothing (final)'}.`, { from, to, allowed: next });
  }
}

/** `PATCH /api/retrofits/:id`: a transition and/or data, under optimistic locking. */
export async function patchRetrofit(tenant: Tenant, mailer: Mailer, publicUrl: string, id: number, body: RetrofitPatch): Promise<RetrofitDetail> {
  const dataFields = RETROFIT_DATA_FIELDS.filter((field) => body[field] !== undefined);
  const role = tenant.user.role;
  if (dataFields.length > 0 && role !== 'engineer' && role !== 'admin') throw forbidden(`Only engineers and admins may change a retrofit's data (${dataFields.join(', ')}).`);
  const result = await database().transaction(async (transaction) => {
    const row = await tenant.findById(Retrofit, id, 'Retrofit', { transaction, lock: transaction.LOCK.UPDATE });
    const from = row.status;
    const to = body.status !== undefined && body.status !== from ? body.status : null;
    if (body.status !== undefined && body.status === from && dataFields.length === 0) checkTransition(from, body.status, role);
    if (to !== null) checkTransition(from, to, role);
    if (row.version !== body.version) throw staleVersion('This retrofit');
    const closed = from === 'rejected' || from === 'verified';
    const lockedFields = dataFields.filter((field) => field !== 'notes');
    if (closed && lockedFields.length > 0) throw conflict('retrofit-closed', `The retrofit is ${from}; only its notes can still change (not ${lockedFields.join(', ')}).`);
    const changes: Partial<Record<string, unknown>> = {};
    for (const field of dataFields) {
      const value = body[field];
      changes[field] = (field === 'actualCapex' || field === 'rebateReceived') && typeof value === 'number' ? String(value) : value;
    }
    if (to === 'ordered' && (changes.orderDate ?? row.orderDate) == null) changes.orderDate = today();
    if (to === 'installed' && (changes.installationDate ?? row.installationDate) == null) changes.installationDate = today();
    if (to === 'verified') {
      const verification = await computeVerification(tenant, { ...row.get(), ...changes } as Retrofit, transaction);
      if (!verification.ready) {
        throw conflict('verification-incomplete', `The savings cannot be verified yet: missing ${verification.missing.join('; ')}.`, { missing: verification.missing });
      }
      changes.verifiedSavingsKwh = verification.annualSavingsKwh;
      changes.verifiedUncertaintyKwh = verification.uncertaintyKwh;
    }
    if (to !== null) {
      changes.status = to;
      changes.statusChangedAt = new Date();
      await tenant.create(RetrofitEvent, { retrofitId: row.id, fromStatus: from, toStatus: to, userId: tenant.user.id, comment: body.comment ?? null }, transaction);
    }
    if (Object.keys(changes).length === 0 && body.comment === undefined) return { row, from, to };
    await row.update({ ...changes, version: row.version + 1 }, { transaction });
    await tenant.audit(to === null ? 'update' : `transition:${to}`, 'retrofit', row.id, { ...changes, ...(body.comment ? { comment: body.comment } : {}) }, transaction);
    return { row, from, to };
  });
  if (result.to !== null) await notifyTransition(tenant, mailer, publicUrl, result.row, result.from, result.to, body.comment ?? null);
  return getRetrofit(tenant, id);
}

/**
 * Who hears of a transition: the approvers of a new proposal; the proposing engineer (else every
 * engineer) of a decision; the approvers and the proposer of an order, installation or verification.
 * Never the person who made it.
 */
async function recipientsOf(tenant: Tenant, row: Retrofit, to: RetrofitStatus): Promise<string[]> {
  const byRole = async (roles: Role[]) =>
    (await User.findAll({ where: { organizationId: tenant.organizationId, role: { [Op.in]: roles }, status: 'active' }, attributes: ['id', 'email'] })) as User[];
  const proposer = row.createdBy === null ? null : await User.findOne({ where: { id: row.createdBy, organizationId: tenant.organizationId, status: 'active' } });
  let people: User[];
  if (to === 'proposed') people = await byRole(['approver']);
  else if (to === 'approved' || to === 'rejected') people = proposer ? [proposer] : await byRole(['engineer']);
  else people = [...(await byRole(['approver'])), ...(proposer ? [proposer] : [])];
  return [...new Set(people.filter((user) => user.id !== tenant.user.id).map((user) => user.email.toLowerCase()))];
}

const VERB: Record<RetrofitStatus, string> = {
  proposed: 'proposed',
  approved: 'approved',
  rejected: 'rejected',
  ordered: 'ordered',
  installed: 'recorded as installed',
  verified: 'verified',
};

async function notifyTransition(tenant: Tenant, mailer: Mailer, publicUrl: string, row: Retrofit, from: RetrofitStatus | null, to: RetrofitStatus, comment: string | null) {
  try {
    const to_ = await recipientsOf(tenant, row, to);
    if (to_.length === 0) return;
    const motor = await Motor.findByPk(row.motorId, { attributes: ['tag', 'siteId'] });
    const site = motor ? await Site.findByPk(motor.siteId, { attributes: ['name'] }) : null;
    const what = `${motor?.tag ?? `motor ${row.motorId}`} (${row.optionCode})${site ? ` at ${site.name}` : ''}`;
    const lines = [
      `${tenant.user.name} ${VERB[to]} the retrofit of ${what}${from ? ` (it was ${from})` : ''}.`,
      ...(comment ? ['', `Comment: ${comment}`] : []),
      '',
      `Predicted savings: ${Math.round(row.predictedSavingsKwh).toLocaleString('en-GB')} kWh/yr`,
      ...(to === 'verified' && row.verifiedSavingsKwh != null ? [`Verified savings: ${Math.round(row.verifiedSavingsKwh).toLocaleString('en-GB')} kWh/yr`] : []),
      ...(to === 'proposed' ? ['An approver decides in the Retrofit log.'] : []),
      '',
      `Open it in Statorline: ${publicUrl}/retrofits/${row.id}`,
    ];
    await mailer.send({ organizationId: tenant.organizationId, to: to_, subject: `Retrofit ${VERB[to]}: ${what}`, text: lines.join('\n') });
  } catch (error) {
    logger.warn('retrofit transition e-mail failed', { retrofitId: row.id, to, error: error instanceof Error ? error.message : String(error) });
  }
}
