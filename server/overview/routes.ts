import { fn, col, Op } from 'sequelize';
import { Motor, Organization, Site } from '../models/index.js';
import { route, type RouteSpec } from '../lib/routing.js';
import type { Tenant } from '../lib/tenant.js';
import { overviewResponse, type OverviewResponse } from '../shared/overview.js';
import { latestCases } from '../cases/service.js';
import { overviewFigures } from './figures.js';

const round = (value: number) => Math.round(value * 100) / 100;

/**
 * Real counts for the Overview: sites, motors in service, installed kW, by site and application;
 * energy today and savings identified, approved, installed and verified (server/overview/figures.ts);
 * the latest business cases.
 */
async function overview(tenant: Tenant): Promise<OverviewResponse> {
  const organization = await Organization.findByPk(tenant.organizationId);
  const sites = await tenant.findAll(Site, { where: { archivedAt: null }, order: [['name', 'ASC']] });
  const motorWhere = tenant.where<Motor>({ status: { [Op.ne]: 'retired' }, siteId: { [Op.in]: sites.map((s) => s.id) } });
  const bySite = (await Motor.findAll({
    attributes: ['siteId', [fn('COUNT', col('id')), 'motors'], [fn('COALESCE', fn('SUM', col('rated_power_kw')), 0), 'kw']],
    where: motorWhere,
    group: ['siteId'],
    raw: true,
  })) as unknown as Array<{ siteId: number; motors: string | number; kw: string | number }>;
  const byApplication = (await Motor.findAll({
    attributes: ['application', [fn('COUNT', col('id')), 'motors'], [fn('COALESCE', fn('SUM', col('rated_power_kw')), 0), 'kw']],
    where: motorWhere,
    group: ['application'],
    order: [['application', 'ASC']],
    raw: true,
  })) as unknown as Array<{ application: string; motors: string | number; kw: string | number }>;
  const siteTotals = new Map(bySite.map((row) => [row.siteId, row]));
  const [figures, cases] = await Promise.all([overviewFigures(tenant.organizationId, sites), latestCases(tenant, 5)]);
  const siteRows = sites.map((site) => {
    const totals = siteTotals.get(site.id);
    const siteFigures = figures.bySite.get(site.id);
    return {
      id: site.id,
      name: site.name,
      motors: Number(totals?.motors ?? 0),
      installedKw: round(Number(totals?.kw ?? 0)),
      ...(siteFigures ? { figures: siteFigures.figures, latestCaseId: siteFigures.latestCaseId } : {}),
    };
  });
  return {
    organization: { id: tenant.organizationId, name: organization?.name ?? '' },
    totals: {
      sites: sites.length,
      motors: siteRows.reduce((sum, row) => sum + row.motors, 0),
      installedKw: round(siteRows.reduce((sum, row) => sum + row.installedKw, 0)),
    },
    sites: siteRows,
    byApplication: byApplication.map((row) => ({ application: row.application, motors: Number(row.motors), installedKw: round(Number(row.kw)) })),
    figures: figures.organization,
    latestCases: cases,
  };
}

export const overviewRoutes: RouteSpec[] = [
  route({
    method: 'get',
    path: '/overview',
    summary: 'Organisation totals for the Overview page',
    tag: 'overview',
    access: 'signed-in',
    response: overviewResponse,
    handler: ({ tenant }) => overview(tenant),
  }),
];
