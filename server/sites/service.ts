/** Sites: the plant locations of an organisation, with their supply, tariff and CO2 factor. */
import { fn, col, Op, type WhereOptions } from 'sequelize';
import { Motor, Site } from '../models/index.js';
import { database } from '../lib/database.js';
import { staleVersion } from '../lib/errors.js';
import { definedOnly } from '../lib/objects.js';
import { orderFrom, pageWindow } from '../lib/lists.js';
import type { Tenant } from '../lib/tenant.js';
import type { ListResult } from '../shared/common.js';
import type { SiteCreate, SiteOutput } from '../shared/site.js';
import type { z } from 'zod';
import type { siteListQuery, siteUpdateBody } from '../shared/site.js';

interface MotorTotals {
  motorCount: number;
  installedKw: number;
}

async function motorTotals(tenant: Tenant, siteIds: number[]): Promise<Map<number, MotorTotals>> {
  if (siteIds.length === 0) return new Map();
  const rows = (await Motor.findAll({
    attributes: ['siteId', [fn('COUNT', col('id')), 'motorCount'], [fn('COALESCE', fn('SUM', col('rated_power_kw')), 0), 'installedKw']],
    where: tenant.where<Motor>({ siteId: { [Op.in]: siteIds }, status: { [Op.ne]: 'retired' } }),
    group: ['siteId'],
    raw: true,
  })) as unknown as Array<{ siteId: number; motorCount: number | string; installedKw: number | string }>;
  return new Map(rows.map((row) => [row.siteId, { motorCount: Number(row.motorCount), installedKw: Number(row.installedKw) }]));
}

function toOutput(site: Site, totals: MotorTotals | undefined): SiteOutput {
  return {
    id: site.id,
    name: site.name,
    code: site.code,
    location: site.location,
    voltageV: site.voltageV,
    frequencyHz: site.frequencyHz as 50 | 60,
    energyPricePerKwh: Number(site.energyPricePerKwh),
    timeOfUse: site.timeOfUse,
    demandChargePerKwMonth: Number(site.demandChargePerKwMonth),
    currency: site.currency,
    co2KgPerKwh: site.co2KgPerKwh,
    defaultHoursPerYear: site.defaultHoursPerYear,
    archived: site.archivedAt !== null,
    motorCount: totals?.motorCount ?? 0,
    installedKw: Math.round((totals?.installedKw ?? 0) * 100) / 100,
    version: site.version,
    updatedAt: site.updatedAt.toISOString(),
  };
}

export async function listSites(tenant: Tenant, query: z.infer<typeof siteListQuery>): Promise<ListResult<SiteOutput>> {
  const where: WhereOptions<Site> = {};
  if (query.archived === 'exclude') Object.assign(where, { archivedAt: null });
  if (query.archived === 'only') Object.assign(where, { archivedAt: { [Op.ne]: null } });
  if (query.q) {
    const pattern = `%${query.q.replace(/[%_\\]/g, '\\$&')}%`;
    Object.assign(where, { [Op.or]: [{ name: { [Op.iLike]: pattern } }, { code: { [Op.iLike]: pattern } }, { location: { [Op.iLike]: pattern } }] });
  }
  const { rows, count } = await tenant.findAndCountAll(Site, {
    where,
    order: orderFrom(query.sort),
    ...pageWindow(query.page, query.pageSize),
  });
  const totals = await motorTotals(tenant, rows.map((site) => site.id));
  return { items: rows.map((site) => toOutput(site, totals.get(site.id))), total: count, page: query.page, pageSize: query.pageSize };
}

export async function getSite(tenant: Tenant, id: number): Promise<SiteOutput> {
  const site = await tenant.findById(Site, id, 'Site');
  return toOutput(site, (await motorTotals(tenant, [id])).get(id));
}

export async function createSite(tenant: Tenant, input: SiteCreate): Promise<SiteOutput> {
  const site = await database().transaction(async (transaction) => {
    const created = await tenant.create(
      Site,
      {
        ...input,
        code: input.code ?? null,
        location: input.location ?? null,
        timeOfUse: input.timeOfUse ?? [],
        energyPricePerKwh: String(input.energyPricePerKwh),
        demandChargePerKwMonth: String(input.demandChargePerKwMonth),
      },
      transaction,
    );
    await tenant.audit('create', 'site', created.id, input, transaction);
    return created;
  });
  return toOutput(site, undefined);
}

/**
 * Applies an edit only if the row still has the version the editor loaded: the UPDATE's WHERE
 * includes the version, so of two concurrent edits exactly one wins and the other gets 409.
 */
export async function updateSite(tenant: Tenant, id: number, input: z.infer<typeof siteUpdateBody>): Promise<SiteOutput> {
  const { version, archived, ...fields } = input;
  await database().transaction(async (transaction) => {
    const site = await tenant.findById(Site, id, 'Site', { transaction });
    const changes: Record<string, unknown> = definedOnly(fields);
    if (fields.energyPricePerKwh !== undefined) changes.energyPricePerKwh = String(fields.energyPricePerKwh);
    if (fields.demandChargePerKwMonth !== undefined) changes.demandChargePerKwMonth = String(fields.demandChargePerKwMonth);
    if (archived !== undefined) changes.archivedAt = archived ? (site.archivedAt ?? new Date()) : null;
    const [updated] = await Site.update(
      { ...changes, version: version + 1 },
      { where: tenant.where<Site>({ id, version }), transaction },
    );
    if (updated === 0) throw staleVersion('This site');
    await tenant.audit(archived === undefined ? 'update' : archived ? 'archive' : 'restore', 'site', id, input, transaction);
  });
  return getSite(tenant, id);
}
