/**
 * Energy and savings figures of the Overview: energy today from every motor's assessed baseline,
 * savings identified (the latest business case of a site, else the register assessed now), and the
 * approved, installed and verified savings of the Retrofit log.
 *
 * Assessing the register is the costly part (calc's screenMotors, about 20 µs per motor): it is done once per request
 * for all sites and kept per organisation until a motor, site, Settings or BLDC design changes (a
 * fingerprint of counts and last-update times, one cheap query), so repeated loads of the dashboard
 * assess nothing.
 */
import { QueryTypes } from 'sequelize';
import { OPTION_SLOTS, screenMotors, type MotorScreening } from '../../calc/assess/screen.js';
import type { MotorInput, PriceBookInput, AssumptionsInput, SiteInput } from '../../calc/assess/schema.js';
import { sumMoney } from '../../calc/economics/money.js';
import { CalcInputError } from '../../calc/errors.js';
import { registerInputs } from '../cases/inputs.js';
import { database } from '../lib/database.js';
import { BusinessCase, type Site } from '../models/index.js';
import type { OverviewFigures } from '../shared/overview.js';

interface SiteEnergy {
  energyTodayKwh: number;
  energyCost: number[];
  co2TodayKg: number;
  unassessed: number;
  identifiedKwh: number;
  identifiedCost: number[];
  identifiedMotors: number;
}

interface CacheEntry {
  fingerprint: string;
  bySite: Map<number, SiteEnergy>;
}

/** Organisations whose assessed register is kept (the least recently used one goes first). */
const CACHE_SIZE = 50;
const cache = new Map<number, CacheEntry>();

/** Changes whenever an input of the assessment changes. */
async function fingerprint(organizationId: number, siteIds: number[]): Promise<string> {
  const [row] = await database().query<{ motors: string; motors_at: Date | null; sites_at: Date | null; settings_at: Date | null; designs_at: Date | null }>(
    `SELECT (SELECT COUNT(*) FROM motors WHERE organization_id = :org) AS motors,
            (SELECT MAX(updated_at) FROM motors WHERE organization_id = :org) AS motors_at,
            (SELECT MAX(updated_at) FROM sites WHERE organization_id = :org) AS sites_at,
            (SELECT MAX(updated_at) FROM organization_settings WHERE organization_id = :org) AS settings_at,
            (SELECT MAX(updated_at) FROM bldc_designs WHERE organization_id = :org) AS designs_at`,
    { replacements: { org: organizationId }, type: QueryTypes.SELECT },
  );
  const time = (value: Date | null | undefined) => (value ? new Date(value).getTime() : 0);
  return [siteIds.join(','), row?.motors, time(row?.motors_at), time(row?.sites_at), time(row?.settings_at), time(row?.designs_at)].join('|');
}

async function assessRegister(organizationId: number, sites: readonly Site[]): Promise<Map<number, SiteEnergy>> {
  const inputs = await registerInputs(organizationId, sites);
  const bySite = new Map<number, SiteEnergy>(sites.map((site) => [site.id, { energyTodayKwh: 0, energyCost: [], co2TodayKg: 0, unassessed: 0, identifiedKwh: 0, identifiedCost: [], identifiedMotors: 0 }]));
  const motorsBySite = new Map<number, MotorInput[]>(sites.map((site) => [site.id, []]));
  for (const motor of inputs.motors) motorsBySite.get(motor.siteId)!.push(motor.input as MotorInput);
  const priceBook = (inputs.priceBook ?? undefined) as PriceBookInput | undefined;
  const assumptions = (inputs.assumptions ?? undefined) as AssumptionsInput | undefined;
  for (const site of inputs.sites) {
    const energy = bySite.get(site.id)!;
    const motors = motorsBySite.get(site.id)!;
    // Only totals are read, so the register goes through calc's screening (assess's figures, no text
    // or result objects: about 1.7 times as many motors per second as assess with totals only).
    let screening: MotorScreening;
    try {
      screening = screenMotors(motors, site.input as SiteInput, priceBook, assumptions);
    } catch (error) {
      // A site, price-book or assumption error: no motor of the site can be assessed.
      if (!(error instanceof CalcInputError)) throw error;
      energy.unassessed += motors.length;
      continue;
    }
    const { annualKwh, annualCost, annualCo2Kg, savingsKwh, savingsCost } = screening.figures;
    for (let index = 0; index < screening.motorCount; index += 1) {
      const recommended = screening.recommendedSlot[index]!;
      if (recommended < 0) {
        energy.unassessed += 1;
        continue;
      }
      const baseline = index * OPTION_SLOTS;
      energy.energyTodayKwh += annualKwh[baseline]!;
      energy.energyCost.push(annualCost[baseline]!);
      energy.co2TodayKg += annualCo2Kg[baseline]!;
      if (recommended > 0) {
        energy.identifiedKwh += savingsKwh[baseline + recommended]!;
        energy.identifiedCost.push(savingsCost[baseline + recommended]!);
        energy.identifiedMotors += 1;
      }
    }
  }
  return bySite;
}

async function siteEnergy(organizationId: number, sites: readonly Site[]): Promise<Map<number, SiteEnergy>> {
  const key = await fingerprint(organizationId, sites.map((site) => site.id));
  const cached = cache.get(organizationId);
  if (cached && cached.fingerprint === key) {
    cache.delete(organizationId);
    cache.set(organizationId, cached);
    return cached.bySite;
  }
  const bySite = await assessRegister(organizationId, sites);
  cache.set(organizationId, { fingerprint: key, bySite });
  if (cache.size > CACHE_SIZE) cache.delete(cache.keys().next().value as number);
  return bySite;
}

interface StageSums {
  kwh: number;
  cost: number[];
  retrofits: number;
}

/** Retrofit savings by site and cumulative stage (approved ⊇ installed ⊇ verified). */
async function retrofitStages(organizationId: number): Promise<Map<number, Record<'approved' | 'installed' | 'verified', StageSums>>> {
  const rows = await database().query<{ site_id: number; status: string; retrofits: string; kwh: number | null; verified_kwh: number | null; cost: string | null; verified_cost: string | null }>(
    `SELECT m.site_id, r.status, COUNT(*) AS retrofits,
            SUM(r.predicted_savings_kwh) AS kwh,
            SUM(COALESCE(r.verified_savings_kwh, r.predicted_savings_kwh)) AS verified_kwh,
            SUM(r.predicted_savings_cost) AS cost,
            SUM(CASE WHEN r.verified_savings_kwh IS NOT NULL AND r.predicted_savings_kwh > 0
                     THEN r.predicted_savings_cost * r.verified_savings_kwh::numeric / r.predicted_savings_kwh::numeric
                     ELSE r.predicted_savings_cost END) AS verified_cost
       FROM retrofits r JOIN motors m ON m.id = r.motor_id
      WHERE r.organization_id = :org AND r.status IN ('approved', 'ordered', 'installed', 'verified')
      GROUP BY m.site_id, r.status`,
    { replacements: { org: organizationId }, type: QueryTypes.SELECT },
  );
  const bySite = new Map<number, Record<'approved' | 'installed' | 'verified', StageSums>>();
  for (const row of rows) {
    let stages = bySite.get(row.site_id);
    if (!stages) bySite.set(row.site_id, (stages = { approved: { kwh: 0, cost: [], retrofits: 0 }, installed: { kwh: 0, cost: [], retrofits: 0 }, verified: { kwh: 0, cost: [], retrofits: 0 } }));
    const count = Number(row.retrofits);
    const add = (stage: StageSums, kwh: number | null, cost: string | null) => {
      stage.kwh += Number(kwh ?? 0);
      stage.cost.push(Math.round(Number(cost ?? 0) * 100) / 100);
      stage.retrofits += count;
    };
    add(stages.approved, row.kwh, row.cost);
    if (row.status === 'installed' || row.status === 'verified') add(stages.installed, row.kwh, row.cost);
    if (row.status === 'verified') add(stages.verified, row.verified_kwh, row.verified_cost);
  }
  return bySite;
}

const round1 = (value: number) => Math.round(value * 10) / 10;

/** Figures per site and for the organisation, and each site's latest case id. */
export async function overviewFigures(organizationId: number, sites: readonly Site[]): Promise<{ bySite: Map<number, { figures: OverviewFigures; latestCaseId: number | null }>; organization: OverviewFigures }> {
  const [energy, stages, cases] = await Promise.all([
    siteEnergy(organizationId, sites),
    retrofitStages(organizationId),
    BusinessCase.findAll({
      attributes: ['id', 'siteId', 'version', 'headline'],
      where: { organizationId, scope: 'site' },
      order: [['siteId', 'ASC'], ['version', 'DESC']],
    }),
  ]);
  const latestCase = new Map<number, BusinessCase>();
  for (const row of cases) if (row.siteId !== null && !latestCase.has(row.siteId)) latestCase.set(row.siteId, row);
  const empty = (): StageSums => ({ kwh: 0, cost: [], retrofits: 0 });
  const bySite = new Map<number, { figures: OverviewFigures; latestCaseId: number | null }>();
  for (const site of sites) {
    const e = energy.get(site.id)!;
    const s = stages.get(site.id) ?? { approved: empty(), installed: empty(), verified: empty() };
    const latest = latestCase.get(site.id);
    const stage = (sums: StageSums) => ({ kwh: round1(sums.kwh), cost: sumMoney(sums.cost), retrofits: sums.retrofits });
    bySite.set(site.id, {
      latestCaseId: latest?.id ?? null,
      figures: {
        currency: site.currency,
        energyTodayKwh: round1(e.energyTodayKwh),
        energyCostToday: sumMoney(e.energyCost),
        co2TodayKg: round1(e.co2TodayKg),
        unassessedMotors: e.unassessed,
        identified: latest
          ? { kwh: latest.headline.savingsKwh, cost: latest.headline.savingsCost, motors: latest.headline.recommendedMotors, source: 'case' }
          : { kwh: round1(e.identifiedKwh), cost: sumMoney(e.identifiedCost), motors: e.identifiedMotors, source: 'assessment' },
        approved: stage(s.approved),
        installed: stage(s.installed),
        verified: stage(s.verified),
      },
    });
  }
  const all = [...bySite.values()].map((entry) => entry.figures);
  const currencies = [...new Set(sites.map((site) => site.currency))];
  const sameCurrency = currencies.length === 1;
  const money = (pick: (figures: OverviewFigures) => number) => (sameCurrency ? sumMoney(all.map(pick)) : 0);
  const sum = (pick: (figures: OverviewFigures) => number) => round1(all.reduce((total, figures) => total + pick(figures), 0));
  const count = (pick: (figures: OverviewFigures) => number) => all.reduce((total, figures) => total + pick(figures), 0);
  const sources = new Set(all.map((figures) => figures.identified.source));
  const organization: OverviewFigures = {
    currency: sameCurrency ? currencies[0]! : null,
    energyTodayKwh: sum((f) => f.energyTodayKwh),
    energyCostToday: money((f) => f.energyCostToday),
    co2TodayKg: sum((f) => f.co2TodayKg),
    unassessedMotors: count((f) => f.unassessedMotors),
    identified: {
      kwh: sum((f) => f.identified.kwh),
      cost: money((f) => f.identified.cost),
      motors: count((f) => f.identified.motors),
      source: sources.size > 1 ? 'mixed' : sources.has('case') ? 'case' : 'assessment',
    },
    approved: { kwh: sum((f) => f.approved.kwh), cost: money((f) => f.approved.cost), retrofits: count((f) => f.approved.retrofits) },
    installed: { kwh: sum((f) => f.installed.kwh), cost: money((f) => f.installed.cost), retrofits: count((f) => f.installed.retrofits) },
    verified: { kwh: sum((f) => f.verified.kwh), cost: money((f) => f.verified.cost), retrofits: count((f) => f.verified.retrofits) },
  };
  return { bySite, organization };
}
