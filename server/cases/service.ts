/**
 * Business cases: generate a snapshot, list and read them, export, e-mail to the approvers, and
 * record the approvers' decision (which moves the case's motors to 'approved' in the Retrofit log).
 *
 * Decisions documented here:
 * - Only the approver role decides (DESIGN.md: approvers "approve or reject retrofit proposals"); an
 *   admin who must decide gives themselves the approver role, which the audit log records. A case is
 *   decided once (409 'already-decided'); a new version can be generated and decided.
 * - Approval: each recommended motor's open proposal ('proposed', any source) becomes 'approved' with
 *   the case's option and predicted figures; a motor without one gets a new retrofit, source 'case',
 *   status 'approved'; a motor already approved or further on (ordered, installed, verified) is left
 *   as it is. Rejection leaves the proposals untouched: management rejected this package, not the
 *   engineer's findings, which may be re-packaged in a new version.
 */
import { promisify } from 'node:util';
import { gzip } from 'node:zlib';
import { Op, QueryTypes, type CreationAttributes, type Transaction } from 'sequelize';
import { database } from '../lib/database.js';
import { AppError, conflict } from '../lib/errors.js';
import { orderFrom, pageWindow } from '../lib/lists.js';
import type { Mailer } from '../lib/mail.js';
import type { Tenant } from '../lib/tenant.js';
import { BusinessCase, CaseSend, Motor, Organization, Retrofit, RetrofitEvent, Site, User } from '../models/index.js';
import type { CaseInputs } from '../models/business-case.js';
import type { ListResult } from '../shared/common.js';
import type { CaseCreate, CaseDecided, CaseDecisionInput, CaseListQuery, CaseOutput, CaseSend as CaseSendInput, CaseSent, CaseSummary } from '../shared/case.js';
import { registerInputs } from './inputs.js';
import { casePdf } from './pdf.js';
import { computeCase } from './snapshot.js';

const gzipAsync = promisify(gzip);

/** Columns of a list row: never the (large) inputs and results. */
const SUMMARY_ATTRIBUTES = ['id', 'organizationId', 'scope', 'siteId', 'version', 'status', 'title', 'currency', 'headline', 'createdBy', 'decidedBy', 'decidedAt', 'decisionComment', 'lastSentAt', 'createdAt', 'updatedAt'] as const;

type People = Map<number, { id: number; name: string; email: string }>;

async function peopleOf(ids: Array<number | null | undefined>): Promise<People> {
  const wanted = [...new Set(ids.filter((id): id is number => typeof id === 'number'))];
  if (wanted.length === 0) return new Map();
  const users = await User.findAll({ where: { id: { [Op.in]: wanted } }, attributes: ['id', 'name', 'email'] });
  return new Map(users.map((user) => [user.id, { id: user.id, name: user.name, email: user.email }]));
}

function summaryOf(row: BusinessCase, people: People): CaseSummary {
  return {
    id: row.id,
    scope: row.scope,
    siteId: row.siteId,
    title: row.title,
    version: row.version,
    status: row.status,
    currency: row.currency,
    createdBy: row.createdBy === null ? null : (people.get(row.createdBy) ?? null),
    createdAt: row.createdAt.toISOString(),
    decidedBy: row.decidedBy == null ? null : (people.get(row.decidedBy) ?? null),
    decidedAt: row.decidedAt ? row.decidedAt.toISOString() : null,
    decisionComment: row.decisionComment ?? null,
    lastSentAt: row.lastSentAt ? row.lastSentAt.toISOString() : null,
    headline: row.headline,
  };
}

/** What the report shows of a case's inputs: everything but the motors themselves, only their count. */
type InputsDigest = Pick<CaseInputs, 'sites' | 'priceBook' | 'assumptions'> & { motorCount: number };

const digestOf = (inputs: CaseInputs): InputsDigest => ({ sites: inputs.sites, priceBook: inputs.priceBook, assumptions: inputs.assumptions, motorCount: inputs.motors.length });

/**
 * The digest computed by PostgreSQL, so reading a report does not fetch and parse every motor's
 * input (the bulk of `inputs`: about as large as the results for a big site).
 */
const INPUTS_DIGEST_SQL = `jsonb_build_object('sites', inputs -> 'sites', 'priceBook', inputs -> 'priceBook', 'assumptions', inputs -> 'assumptions', 'motorCount', jsonb_array_length(inputs -> 'motors'))`;

async function outputOf(row: BusinessCase, inputs: InputsDigest = digestOf(row.inputs)): Promise<CaseOutput> {
  const sends = await CaseSend.findAll({ where: { caseId: row.id }, order: [['sentAt', 'ASC']] });
  const people = await peopleOf([row.createdBy, row.decidedBy, ...sends.map((send) => send.sentBy)]);
  const siteInputs = inputs.sites.map((site) => {
    const input = site.input as { energyPricePerKwh?: number; co2KgPerKwh?: number; defaultHoursPerYear?: number };
    return { id: site.id, name: site.name, currency: site.currency, energyPricePerKwh: input.energyPricePerKwh ?? 0, co2KgPerKwh: input.co2KgPerKwh ?? 0, defaultHoursPerYear: input.defaultHoursPerYear ?? 0 };
  });
  return {
    ...summaryOf(row, people),
    results: row.results,
    basis: {
      sites: siteInputs,
      motorCount: inputs.motorCount,
      priceBook: inputs.priceBook ? 'organisation' : 'calc defaults',
      assumptions: inputs.assumptions ? 'organisation' : 'calc defaults',
    },
    sends: sends.map((send) => sendOutput(send, people)),
  };
}

function sendOutput(send: CaseSend, people: People) {
  return { id: send.id, sentAt: send.sentAt.toISOString(), sentBy: send.sentBy === null ? null : (people.get(send.sentBy) ?? null), to: send.toAddresses, messageId: send.messageId };
}

/** The sites a new case covers: one site, or every site not archived. */
async function sitesFor(tenant: Tenant, body: CaseCreate): Promise<{ sites: Site[]; title: string; siteId: number | null }> {
  if (body.siteId !== undefined) {
    const site = await tenant.findById(Site, body.siteId, 'Site');
    return { sites: [site], title: site.name, siteId: site.id };
  }
  const sites = await tenant.findAll(Site, { where: { archivedAt: null }, order: [['name', 'ASC']] });
  if (sites.length === 0) throw conflict('no-sites', 'The organisation has no sites yet; add a site and its motors first.');
  const organization = await Organization.findByPk(tenant.organizationId);
  return { sites, title: organization?.name ?? 'All sites', siteId: null };
}

/**
 * Columns a new case reads back from its INSERT: all but the inputs and results just written, which
 * PostgreSQL would otherwise send back for pg to parse again (about 300 ms for a 10,000-motor site).
 */
const SMALL_COLUMNS = () =>
  Object.values(BusinessCase.getAttributes())
    .map((attribute) => attribute.field ?? '')
    .filter((field) => field !== '' && field !== 'inputs' && field !== 'results');

/** Generates a new snapshot (version = the scope's last + 1). */
export async function createCase(tenant: Tenant, body: CaseCreate): Promise<CaseOutput> {
  const { sites, title, siteId } = await sitesFor(tenant, body);
  const currencies = [...new Set(sites.map((site) => site.currency))];
  if (currencies.length > 1) {
    throw conflict('mixed-currencies', `The sites use different currencies (${currencies.join(', ')}); money cannot be added across them. Generate a business case per site.`, {
      currencies,
    });
  }
  const inputs = await registerInputs(tenant.organizationId, sites);
  if (inputs.motors.length === 0) throw conflict('no-motors', `${body.siteId !== undefined ? `Site ${title}` : 'The organisation'} has no motors in service to assess.`);
  const { results, headline, currency } = computeCase(inputs);
  const scope = siteId === null ? 'all' : 'site';
  const row = await database().transaction(async (transaction) => {
    // One generator at a time per scope, so versions count up without gaps or clashes.
    await database().query('SELECT pg_advisory_xact_lock(:organization, :scopeKey)', {
      replacements: { organization: tenant.organizationId, scopeKey: siteId ?? 0 },
      type: QueryTypes.SELECT,
      transaction,
    });
    const last = (await BusinessCase.max('version', { where: tenant.where<BusinessCase>({ scope, siteId }), transaction })) as number | null;
    const created = await tenant.create(
      BusinessCase,
      { scope, siteId, version: (last ?? 0) + 1, title, currency, headline, inputs, results, createdBy: tenant.user.id },
      transaction,
      SMALL_COLUMNS(),
    );
    await tenant.audit('create', 'business-case', created.id, { scope, siteId, version: created.version, motors: inputs.motors.length }, transaction);
    return created;
  });
  return outputOf(row);
}

export async function listCases(tenant: Tenant, query: CaseListQuery): Promise<ListResult<CaseSummary>> {
  const where: Record<string, unknown> = {};
  if (query.scope) where.scope = query.scope;
  if (query.siteId) where.siteId = query.siteId;
  if (query.status) where.status = query.status;
  const { rows, count } = await tenant.findAndCountAll(BusinessCase, {
    attributes: [...SUMMARY_ATTRIBUTES],
    where,
    order: orderFrom(query.sort),
    ...pageWindow(query.page, query.pageSize),
  });
  const people = await peopleOf(rows.flatMap((row) => [row.createdBy, row.decidedBy]));
  return { items: rows.map((row) => summaryOf(row, people)), total: count, page: query.page, pageSize: query.pageSize };
}

/** The latest cases of the organisation (the Overview). */
export async function latestCases(tenant: Tenant, limit = 5): Promise<CaseSummary[]> {
  return (await listCases(tenant, { page: 1, pageSize: limit, sort: '-createdAt' })).items;
}

/**
 * Recently read reports' immutable parts (results as JSON text, the inputs' digest), by case id, least
 * recently used first. A case's results never change after generation (only status, decision and
 * sendings do), so the text can be kept: reading a report then moves no megabytes through JSON.parse
 * and JSON.stringify (a 4,000-motor site's results are about 3 MB; under 200 concurrent readers that
 * was the whole cost, see tests/bench/load.bench.ts). Bounded by RESULTS_CACHE_BYTES per process.
 */
const resultsCache = new Map<number, { inputs: InputsDigest; results: string }>();
const RESULTS_CACHE_BYTES = 64 * 1024 * 1024;
let resultsCacheBytes = 0;

/** The immutable parts of a case for its report: the inputs' digest and the results as JSON text. */
async function immutableParts(id: number): Promise<{ inputs: InputsDigest; results: string }> {
  const cached = resultsCache.get(id);
  if (cached !== undefined) {
    resultsCache.delete(id);
    resultsCache.set(id, cached);
    return cached;
  }
  const [row] = await database().query<{ inputs: InputsDigest; results: string }>(`SELECT ${INPUTS_DIGEST_SQL} AS inputs, results::text AS results FROM business_cases WHERE id = :id`, {
    replacements: { id },
    type: QueryTypes.SELECT,
  });
  if (!row) throw new AppError('not-found', 'Business case not found.', 404);
  resultsCache.set(id, row);
  resultsCacheBytes += row.results.length;
  for (const [oldId, parts] of resultsCache) {
    if (resultsCacheBytes <= RESULTS_CACHE_BYTES || oldId === id) break;
    resultsCache.delete(oldId);
    resultsCacheBytes -= parts.results.length;
  }
  return row;
}

/**
 * `GET /api/cases/:id` as JSON text (a CaseOutput), its stored results spliced in as the
 * text PostgreSQL (or the cache) holds. The organisation check is the row read through the tenant
 * (its small columns only: status, decision and sendings are always read fresh).
 */
export async function getCaseJson(tenant: Tenant, id: number): Promise<string> {
  const { head, results } = await caseParts(tenant, id);
  return spliceResults(head, results);
}

/** The case's document without its results as JSON text (what changes: status, decision, sendings), and the results' text. */
async function caseParts(tenant: Tenant, id: number): Promise<{ rowId: number; head: string; results: string }> {
  const row = await tenant.findById(BusinessCase, id, 'Business case', { attributes: { exclude: ['inputs', 'results'] } });
  const parts = await immutableParts(row.id);
  const { results: _notLoaded, ...rest } = await outputOf(row, parts.inputs);
  return { rowId: row.id, head: JSON.stringify(rest), results: parts.results };
}

const spliceResults = (head: string, results: string) => `${head.slice(0, -1)},"results":${results}}`;

/**
 * The same document gzipped, for clients that accept it (every browser). A site's report is megabytes
 * of JSON that compress about tenfold; compressing it on every read cost more than the read itself,
 * so the last compressed document of each case is kept and reused while its head (status, decision,
 * sendings) is unchanged. The organisation check still runs on every read (caseParts).
 */
const gzipped = new Map<number, { head: string; body: Buffer }>();
const GZIP_CACHE_CASES = 32;

export async function getCaseJsonGzip(tenant: Tenant, id: number): Promise<Buffer> {
  const { rowId, head, results } = await caseParts(tenant, id);
  const cached = gzipped.get(rowId);
  if (cached && cached.head === head) return cached.body;
  const body = await gzipAsync(spliceResults(head, results));
  gzipped.delete(rowId);
  gzipped.set(rowId, { head, body });
  if (gzipped.size > GZIP_CACHE_CASES) gzipped.delete(gzipped.keys().next().value as number);
  return body;
}

export async function caseRow(tenant: Tenant, id: number): Promise<BusinessCase> {
  return tenant.findById(BusinessCase, id, 'Business case');
}

/** File name of an export: `business-case-<title>-v<version>.<ext>`, ASCII only. */
export function exportFileName(row: BusinessCase, extension: string): string {
  const slug = row.title.normalize('NFKD').replace(/[^A-Za-z0-9]+/g, '-').replace(/^-|-$/g, '').toLowerCase() || 'case';
  return `business-case-${slug}-v${row.version}.${extension}`;
}

/** Case title with its version, for subjects and headings. */
const caseName = (row: BusinessCase) => `${row.title} business case v${row.version}`;

const money = (amount: number, currency: string) => `${amount.toLocaleString('en-GB', { minimumFractionDigits: 0, maximumFractionDigits: 0 })} ${currency}`;

/** E-mails the case with its PDF to the organisation's approvers and the given addresses. */
export async function sendCase(tenant: Tenant, id: number, body: CaseSendInput, mailer: Mailer, publicUrl: string): Promise<CaseSent> {
  const row = await caseRow(tenant, id);
  const approvers = await User.findAll({ where: { organizationId: tenant.organizationId, role: 'approver', status: 'active' }, attributes: ['email'] });
  const to = [...new Set([...approvers.map((user) => user.email.toLowerCase()), ...(body.to ?? []).map((email) => email.toLowerCase())])];
  if (to.length === 0) throw conflict('no-recipients', 'The organisation has no active approver and no address was given; add an address in "to".');
  const pdf = await casePdf(row);
  const totals = row.results.totals;
  const link = `${publicUrl}/cases/${row.id}`;
  const text = [
    `${tenant.user.name} sends you the ${caseName(row)} for review.`,
    ...(body.message ? ['', body.message] : []),
    '',
    `Recommended retrofits: ${totals.recommendedMotors} of ${totals.motors} motors`,
    `Energy saved: ${Math.round(totals.savingsKwh).toLocaleString('en-GB')} kWh/yr (${totals.savingsPct} % of ${Math.round(totals.baselineKwh).toLocaleString('en-GB')} kWh/yr today)`,
    `Cost saved: ${money(totals.savingsCost, row.currency)}/yr; CO2 avoided: ${(totals.co2SavedKg / 1000).toFixed(1)} t/yr`,
    `Capex after rebates: ${money(totals.capex, row.currency)}; simple payback ${totals.simplePaybackYears ?? '–'} years; NPV ${money(totals.npv, row.currency)}; IRR ${totals.irr === null ? '–' : `${(totals.irr * 100).toFixed(1)} %`}`,
    '',
    `The full report is attached as PDF. Approvers decide in Statorline: ${link}`,
  ].join('\n');
  let messageId: string;
  try {
    ({ messageId } = await mailer.send({
      organizationId: tenant.organizationId,
      to,
      subject: `For approval: ${caseName(row)}`,
      text,
      attachments: [{ filename: exportFileName(row, 'pdf'), content: pdf, contentType: 'application/pdf' }],
    }));
  } catch (error) {
    throw new AppError('mail-failed', `The e-mail could not be sent (${error instanceof Error ? error.message : String(error)}); try again.`, 503);
  }
  const send = await database().transaction(async (transaction) => {
    const now = new Date();
    const created = await CaseSend.create({ organizationId: tenant.organizationId, caseId: row.id, sentBy: tenant.user.id, toAddresses: to, messageId, sentAt: now }, { transaction });
    await BusinessCase.update(
      { lastSentAt: now, ...(row.status === 'draft' ? { status: 'sent' as const } : {}) },
      { where: tenant.where<BusinessCase>({ id: row.id }), transaction },
    );
    await tenant.audit('send', 'business-case', row.id, { to }, transaction);
    return created;
  });
  const updated = await caseRow(tenant, id);
  const people = await peopleOf([updated.createdBy, updated.decidedBy, tenant.user.id]);
  return { case: summaryOf(updated, people), send: sendOutput(send, people) };
}

/** The Retrofit log after an approval (see the module comment). */
async function approveRetrofits(tenant: Tenant, row: BusinessCase, comment: string, transaction: Transaction): Promise<{ created: number; approved: number }> {
  const items = row.results.items.filter((item) => item.optionCode !== 'keep');
  if (items.length === 0) return { created: 0, approved: 0 };
  const motorIds = items.map((item) => item.motorId);
  const existingMotors = new Set(
    (await Motor.findAll({ where: { organizationId: tenant.organizationId, id: { [Op.in]: motorIds } }, attributes: ['id'], transaction })).map((motor) => motor.id),
  );
  const retrofits = await Retrofit.findAll({ where: { organizationId: tenant.organizationId, motorId: { [Op.in]: motorIds } }, transaction, lock: transaction.LOCK.UPDATE });
  const byMotor = new Map<number, Retrofit[]>();
  for (const retrofit of retrofits) {
    const list = byMotor.get(retrofit.motorId) ?? [];
    list.push(retrofit);
    byMotor.set(retrofit.motorId, list);
  }
  let created = 0;
  let approved = 0;
  const now = new Date();
  const note = `Approved with the ${caseName(row)}${comment ? `: ${comment}` : ''}`;
  const events: Array<CreationAttributes<RetrofitEvent>> = [];
  const toCreate: Array<CreationAttributes<Retrofit>> = [];
  for (const item of items) {
    if (!existingMotors.has(item.motorId)) continue;
    const list = byMotor.get(item.motorId) ?? [];
    if (list.some((retrofit) => ['approved', 'ordered', 'installed', 'verified'].includes(retrofit.status))) continue;
    const figures = { optionCode: item.optionCode, predictedSavingsKwh: item.savingsKwh, predictedSavingsCost: item.savingsCost, capex: item.capex, npv: item.npv, currency: row.currency };
    const proposed = list.filter((retrofit) => retrofit.status === 'proposed');
    if (proposed.length > 0) {
      for (const retrofit of proposed) {
        await retrofit.update({ ...figures, status: 'approved', statusChangedAt: now, version: retrofit.version + 1 }, { transaction });
        events.push({ organizationId: tenant.organizationId, retrofitId: retrofit.id, fromStatus: 'proposed', toStatus: 'approved', userId: tenant.user.id, comment: note });
        approved += 1;
      }
    } else {
      // Source 'case' is added to the enum by migration 20261201160200.
      toCreate.push({ organizationId: tenant.organizationId, motorId: item.motorId, ...figures, status: 'approved', statusChangedAt: now, source: 'case', jobId: null, createdBy: tenant.user.id });
      created += 1;
    }
  }
  if (toCreate.length > 0) {
    const inserted = await Retrofit.bulkCreate(toCreate, { transaction, returning: ['id'] });
    for (const retrofit of inserted) events.push({ organizationId: tenant.organizationId, retrofitId: retrofit.id, fromStatus: null, toStatus: 'approved', userId: tenant.user.id, comment: note });
  }
  if (events.length > 0) await RetrofitEvent.bulkCreate(events, { transaction });
  return { created, approved };
}

/** Records an approver's decision, updates the Retrofit log, e-mails the case's author. */
export async function decideCase(tenant: Tenant, id: number, body: CaseDecisionInput, mailer: Mailer, publicUrl: string): Promise<CaseDecided> {
  const { row, retrofits } = await database().transaction(async (transaction) => {
    const row = await tenant.findById(BusinessCase, id, 'Business case', { transaction, lock: transaction.LOCK.UPDATE });
    if (row.status === 'approved' || row.status === 'rejected') {
      throw conflict('already-decided', `This business case was already ${row.status} on ${row.decidedAt?.toISOString().slice(0, 10) ?? '?'}; generate a new version to decide again.`);
    }
    const retrofits = body.decision === 'approved' ? await approveRetrofits(tenant, row, body.comment, transaction) : { created: 0, approved: 0 };
    await row.update({ status: body.decision, decidedBy: tenant.user.id, decidedAt: new Date(), decisionComment: body.comment || null }, { transaction });
    await tenant.audit(body.decision === 'approved' ? 'approve' : 'reject', 'business-case', row.id, { comment: body.comment, ...retrofits }, transaction);
    return { row, retrofits };
  });
  const author = row.createdBy === null ? null : await User.findByPk(row.createdBy);
  if (author && author.status !== 'disabled') {
    try {
      await mailer.send({
        organizationId: tenant.organizationId,
        to: [author.email],
        subject: `${body.decision === 'approved' ? 'Approved' : 'Rejected'}: ${caseName(row)}`,
        text: [
          `${tenant.user.name} ${body.decision} the ${caseName(row)} on ${row.decidedAt?.toISOString().slice(0, 16).replace('T', ' ')} UTC.`,
          '',
          body.comment ? `Comment: ${body.comment}` : 'No comment was given.',
          '',
          body.decision === 'approved'
            ? `The Retrofit log now lists ${retrofits.approved + retrofits.created} motors of this case as approved (${retrofits.created} new entries).`
            : 'The proposals of this case stay in the Retrofit log as they were.',
          `${publicUrl}/cases/${row.id}`,
        ].join('\n'),
      });
    } catch {
      // The decision stands; the notice is lost. The decision is on the case for everyone to see.
    }
  }
  const people = await peopleOf([row.createdBy, row.decidedBy]);
  return { case: summaryOf(row, people), retrofits: { ...retrofits, rejected: 0 } };
}

