/**
 * The business case computed from its stored inputs (pure: no database). Every motor is assessed by
 * calc's `assess`; its recommended option (highest positive NPV, else 'keep') becomes its item; the
 * items are summed by area (feeder), site and case, money in decimal.js through calc's `sumMoney`;
 * the case's economics come from its aggregate cash flows (server/cases/economics.ts); the
 * sensitivity scales the parts of each result that the energy price and the hours scale
 * (server/cases/sensitivity.ts).
 */
import { assess, type Assumption, type AssessResult, type OptionResult } from '../../calc/assess/assess.js';
import { DEFAULT_DISCOUNT_RATE_PCT, DEFAULT_ENERGY_ESCALATION_PCT } from '../../calc/assess/defaults.js';
import type { AssumptionsInput, MotorInput, PriceBookInput, SiteInput } from '../../calc/assess/schema.js';
import { presentValueOfEscalatingSeries } from '../../calc/economics/cash-flows.js';
import { roundMoney, sumMoney } from '../../calc/economics/money.js';
import { CalcInputError } from '../../calc/errors.js';
import type { CaseInputs } from '../models/business-case.js';
import type { CaseAssumption, CaseBar, CaseGroup, CaseItem, CaseResults, CaseSummary, CaseTotals } from '../shared/case.js';
import { aggregateEconomics, cumulativeCashFlow, type InvestmentLine } from './economics.js';
import { effectivePriceBook, grossCapexAndRebate } from './rebates.js';
import { caseSensitivity, type SensitivityLine } from './sensitivity.js';

/** DESIGN.md's cautions, printed in every report. */
export const CASE_CAUTIONS: readonly string[] = [
  'Motor and drive replacement is electrical work: these results are estimates for planning, not a design approval.',
  'Sizing of conductors, protection and harmonics follows local codes and a licensed electrician or engineer.',
  'A permanent-magnet rotor is hazardous to handle (strong attraction, pinching, pacemakers).',
  'A BLDC drive changes the harmonic and EMC picture of the supply.',
];

const round1 = (value: number) => Math.round(value * 10) / 10;
const round2 = (value: number) => Math.round(value * 100) / 100;
const round3 = (value: number) => Math.round(value * 1000) / 1000;
const ratio = (numerator: number, denominator: number) => (denominator > 0 && numerator >= 0 ? round2(numerator / denominator) : null);

interface Assessed {
  item: CaseItem;
  result: AssessResult;
  option: OptionResult;
  siteIndex: number;
}

function itemOf(motorRow: CaseInputs['motors'][number], siteName: string, result: AssessResult, option: OptionResult, book: ReturnType<typeof effectivePriceBook>): CaseItem {
  const motor = motorRow.input as MotorInput;
  const baseline = result.baseline;
  const keep = option.code === 'keep';
  const { gross, rebate } = keep ? { gross: 0, rebate: 0 } : grossCapexAndRebate(option.code, book, motor.ratedPowerKw, result.motor.controlMethod === 'variable-speed-drive');
  return {
    motorId: motorRow.id,
    tag: motorRow.tag,
    description: motor.description ?? null,
    siteId: motorRow.siteId,
    siteName,
    area: motor.area ?? null,
    application: result.motor.application,
    ratedPowerKw: motor.ratedPowerKw,
    optionCode: option.code,
    optionLabel: option.label,
    reason: result.recommended.reason,
    usesBldcDesign: motorRow.bldcDesignId !== null && motor.bldcCurve !== undefined,
    baselineKwh: baseline.annualKwh,
    afterKwh: option.annualKwh,
    savingsKwh: keep ? 0 : option.savingsKwh,
    baselineCost: baseline.annualCost,
    afterCost: option.annualCost,
    savingsCost: keep ? 0 : option.savingsCost,
    co2SavedKg: keep ? 0 : option.co2SavedKg,
    lineCurrentBeforeA: baseline.lineCurrentA,
    lineCurrentAfterA: option.lineCurrentA,
    lineCurrentFreedA: keep ? 0 : option.lineCurrentReductionA,
    kvaBefore: baseline.kva,
    kvaAfter: option.kva,
    kvaFreed: keep ? 0 : option.kvaReduction,
    grossCapex: gross,
    rebates: rebate,
    capex: keep ? 0 : option.capex,
    lifeYears: option.lifeYears,
    simplePaybackYears: keep ? null : option.simplePaybackYears,
    discountedPaybackYears: keep ? null : option.discountedPaybackYears,
    npv: keep ? 0 : option.npv,
    irr: keep ? null : option.irr,
    lifeCycleCost: option.lifeCycleCost,
  };
}

/** Sums of a group of items: physical figures as doubles rounded once, money through sumMoney. */
function groupOf(siteId: number, siteName: string, area: string | null, items: readonly CaseItem[]): CaseGroup {
  let kw = 0, baselineKwh = 0, savingsKwh = 0, co2 = 0, current = 0, kva = 0, recommended = 0;
  const baselineCost: number[] = [], savingsCost: number[] = [], gross: number[] = [], rebates: number[] = [], capex: number[] = [], npv: number[] = [];
  for (const item of items) {
    kw += item.ratedPowerKw;
    baselineKwh += item.baselineKwh;
    baselineCost.push(item.baselineCost);
    if (item.optionCode === 'keep') continue;
    recommended += 1;
    savingsKwh += item.savingsKwh;
    co2 += item.co2SavedKg;
    current += item.lineCurrentFreedA;
    kva += item.kvaFreed;
    savingsCost.push(item.savingsCost);
    gross.push(item.grossCapex);
    rebates.push(item.rebates);
    capex.push(item.capex);
    npv.push(item.npv);
  }
  const group = {
    siteId,
    siteName,
    area,
    motors: items.length,
    recommendedMotors: recommended,
    installedKw: round2(kw),
    baselineKwh: round1(baselineKwh),
    afterKwh: round1(baselineKwh - savingsKwh),
    savingsKwh: round1(savingsKwh),
    baselineCost: sumMoney(baselineCost),
    savingsCost: sumMoney(savingsCost),
    co2SavedKg: round1(co2),
    lineCurrentFreedA: round2(current),
    kvaFreed: round3(kva),
    grossCapex: sumMoney(gross),
    rebates: sumMoney(rebates),
    capex: sumMoney(capex),
    npv: sumMoney(npv),
    simplePaybackYears: null as number | null,
  };
  group.simplePaybackYears = ratio(group.capex, group.savingsCost);
  return group;
}

/** Groups of groups (areas → site, sites → case): same sums over the groups' own sums (exact: all in cents). */
function mergeGroups(siteId: number, siteName: string, area: string | null, groups: readonly CaseGroup[]): CaseGroup {
  const sum = (pick: (group: CaseGroup) => number, decimals: number) => round(groups.reduce((total, group) => total + pick(group), 0), decimals);
  const money = (pick: (group: CaseGroup) => number) => sumMoney(groups.map(pick));
  const merged: CaseGroup = {
    siteId,
    siteName,
    area,
    motors: groups.reduce((total, group) => total + group.motors, 0),
    recommendedMotors: groups.reduce((total, group) => total + group.recommendedMotors, 0),
    installedKw: sum((g) => g.installedKw, 2),
    baselineKwh: sum((g) => g.baselineKwh, 1),
    afterKwh: sum((g) => g.afterKwh, 1),
    savingsKwh: sum((g) => g.savingsKwh, 1),
    baselineCost: money((g) => g.baselineCost),
    savingsCost: money((g) => g.savingsCost),
    co2SavedKg: sum((g) => g.co2SavedKg, 1),
    lineCurrentFreedA: sum((g) => g.lineCurrentFreedA, 2),
    kvaFreed: sum((g) => g.kvaFreed, 3),
    grossCapex: money((g) => g.grossCapex),
    rebates: money((g) => g.rebates),
    capex: money((g) => g.capex),
    npv: money((g) => g.npv),
    simplePaybackYears: null,
  };
  merged.simplePaybackYears = ratio(merged.capex, merged.savingsCost);
  return merged;
}

function round(value: number, decimals: number) {
  const scale = 10 ** decimals;
  return Math.round(value * scale) / scale;
}

/** Savings bars by a key of the recommended items. */
function barsBy(items: readonly CaseItem[], keyOf: (item: CaseItem) => string, labelOf: (item: CaseItem) => string): CaseBar[] {
  const groups = new Map<string, { label: string; motors: number; kwh: number; cost: number[]; capex: number[] }>();
  for (const item of items) {
    if (item.optionCode === 'keep') continue;
    const key = keyOf(item);
    let group = groups.get(key);
    if (!group) groups.set(key, (group = { label: labelOf(item), motors: 0, kwh: 0, cost: [], capex: [] }));
    group.motors += 1;
    group.kwh += item.savingsKwh;
    group.cost.push(item.savingsCost);
    group.capex.push(item.capex);
  }
  return [...groups]
    .map(([key, group]) => ({ key, label: group.label, motors: group.motors, savingsKwh: round1(group.kwh), savingsCost: sumMoney(group.cost), capex: sumMoney(group.capex) }))
    .sort((a, b) => b.savingsCost - a.savingsCost || a.key.localeCompare(b.key));
}

/**
 * Assumptions merged over the motors: one entry per (what, source); a value the motors share is
 * printed as is, differing numbers as their range, differing texts as a count.
 */
function mergeAssumptions(lists: Iterable<readonly Assumption[]>): CaseAssumption[] {
  const merged = new Map<string, { what: string; source: string; values: Set<number | string>; motors: number }>();
  for (const list of lists) {
    for (const assumption of list) {
      const key = `${assumption.what}\u0000${assumption.source}`;
      let entry = merged.get(key);
      if (!entry) merged.set(key, (entry = { what: assumption.what, source: assumption.source, values: new Set(), motors: 0 }));
      entry.motors += 1;
      if (entry.values.size < 1000) entry.values.add(assumption.value);
    }
  }
  return [...merged.values()].map((entry) => {
    const values = [...entry.values];
    let value: number | string;
    if (values.length === 1) value = values[0]!;
    else if (values.every((v) => typeof v === 'number')) value = `${Math.min(...(values as number[]))} to ${Math.max(...(values as number[]))}`;
    else value = `${values.length}${entry.values.size >= 1000 ? '+' : ''} different values (see each motor)`;
    return { what: entry.what, value, source: entry.source, motors: entry.motors };
  });
}

/** The stored inputs → the snapshot's results and its headline figures. */
export function computeCase(inputs: CaseInputs): { results: CaseResults; headline: CaseSummary['headline']; currency: string } {
  const priceBook = (inputs.priceBook ?? undefined) as PriceBookInput | undefined;
  const assumptions = (inputs.assumptions ?? undefined) as AssumptionsInput | undefined;
  const book = effectivePriceBook(priceBook);
  const rate = (assumptions?.discountRatePct ?? DEFAULT_DISCOUNT_RATE_PCT) / 100;
  const escalation = (assumptions?.energyEscalationPct ?? DEFAULT_ENERGY_ESCALATION_PCT) / 100;
  const siteIndex = new Map(inputs.sites.map((site, index) => [site.id, index]));
  const currency = inputs.sites[0]?.currency ?? priceBook?.currency ?? 'EUR';

  const assessed: Assessed[] = [];
  const failed: CaseResults['failed'] = [];
  const assumptionLists: Assumption[][] = [];
  for (const motorRow of inputs.motors) {
    const index = siteIndex.get(motorRow.siteId)!;
    const site = inputs.sites[index]!;
    try {
      const result = assess(motorRow.input as MotorInput, site.input as SiteInput, priceBook, assumptions, { detail: 'totals' });
      const option = result.options.find((candidate) => candidate.code === result.recommended.code) ?? result.baseline;
      assessed.push({ item: itemOf(motorRow, site.name, result, option, book), result, option, siteIndex: index });
      assumptionLists.push(result.assumptions);
      if (option.code !== 'keep') assumptionLists.push(option.assumptions.map((a) => ({ ...a, what: `${option.label}: ${a.what}` })));
    } catch (error) {
      if (!(error instanceof CalcInputError)) throw error;
      failed.push({ motorId: motorRow.id, tag: motorRow.tag, siteName: site.name, message: error.message.replace(/^"([^"]*)" /, '$1: ') });
    }
  }
  assessed.sort((a, b) => a.item.siteName.localeCompare(b.item.siteName) || a.item.tag.localeCompare(b.item.tag));
  const items = assessed.map((entry) => entry.item);

  // Areas (feeders) within sites, then sites, then the case.
  const byArea = new Map<string, CaseItem[]>();
  for (const item of items) {
    const key = `${item.siteId}\u0000${item.area ?? ''}`;
    let list = byArea.get(key);
    if (!list) byArea.set(key, (list = []));
    list.push(item);
  }
  const perArea = [...byArea.values()].map((list) => groupOf(list[0]!.siteId, list[0]!.siteName, list[0]!.area ?? '', list));
  const perSite = inputs.sites
    .map((site) => mergeGroups(site.id, site.name, null, perArea.filter((group) => group.siteId === site.id)))
    .sort((a, b) => a.siteName.localeCompare(b.siteName));
  const all = mergeGroups(0, '', null, perSite);

  const recommended = assessed.filter((entry) => entry.option.code !== 'keep');
  const lines: InvestmentLine[] = recommended.map((entry) => ({ capex: entry.item.capex, savingsCost: entry.item.savingsCost, lifeYears: entry.item.lifeYears }));
  const economics = aggregateEconomics(lines, rate, escalation);
  const lifeCycleCost = sumMoney(recommended.map((entry) => entry.item.lifeCycleCost));
  const lifeCycleCostToday = sumMoney(recommended.map((entry) => roundMoney(presentValueOfEscalatingSeries(entry.item.baselineCost, entry.item.lifeYears, rate, escalation))));

  const totals: CaseTotals = {
    currency,
    motors: inputs.motors.length,
    recommendedMotors: all.recommendedMotors,
    failedMotors: failed.length,
    installedKw: all.installedKw,
    baselineKwh: all.baselineKwh,
    afterKwh: all.afterKwh,
    savingsKwh: all.savingsKwh,
    savingsPct: all.baselineKwh > 0 ? round2((100 * all.savingsKwh) / all.baselineKwh) : 0,
    baselineCost: all.baselineCost,
    co2SavedKg: all.co2SavedKg,
    lineCurrentFreedA: all.lineCurrentFreedA,
    kvaFreed: all.kvaFreed,
    grossCapex: all.grossCapex,
    rebates: all.rebates,
    capex: economics.capex,
    savingsCost: economics.firstYearSavings,
    simplePaybackYears: economics.simplePaybackYears,
    discountedPaybackYears: economics.discountedPaybackYears,
    npv: economics.npv,
    irr: economics.irr,
    lifeCycleCost,
    lifeCycleCostToday,
    analysisYears: economics.analysisYears,
    discountRatePct: round(rate * 100, 4),
    energyEscalationPct: round(escalation * 100, 4),
  };

  const sensitivityLines: SensitivityLine[] = recommended.map((entry) => ({
    capex: entry.item.capex,
    lifeYears: entry.item.lifeYears,
    energyCostSaved: entry.result.baseline.energyCost - entry.option.energyCost,
    demandCostSaved: entry.result.baseline.demandCost - entry.option.demandCost,
    annualHours: entry.result.motor.annualHours,
  }));

  const results: CaseResults = {
    totals,
    items,
    perSite,
    perArea,
    charts: {
      savingsBySite: perSite.map((site) => ({ key: String(site.siteId), label: site.siteName, motors: site.recommendedMotors, savingsKwh: site.savingsKwh, savingsCost: site.savingsCost, capex: site.capex })),
      savingsByApplication: barsBy(items, (item) => item.application, (item) => item.application),
      savingsByOption: barsBy(items, (item) => item.optionCode, (item) => item.optionLabel),
      cashFlow: cumulativeCashFlow(economics.flows, rate),
      energyBySite: perSite.map((site) => ({ siteId: site.siteId, label: site.siteName, baselineKwh: site.baselineKwh, afterKwh: site.afterKwh })),
    },
    sensitivity: caseSensitivity(sensitivityLines, rate, escalation, economics),
    assumptions: mergeAssumptions(assumptionLists),
    sources: inputs.sources,
    cautions: [...CASE_CAUTIONS],
    failed,
  };
  const headline = {
    motors: totals.motors,
    recommendedMotors: totals.recommendedMotors,
    savingsKwh: totals.savingsKwh,
    savingsCost: totals.savingsCost,
    co2SavedKg: totals.co2SavedKg,
    capex: totals.capex,
    npv: totals.npv,
    simplePaybackYears: totals.simplePaybackYears,
    irr: totals.irr,
  };
  return { results, headline, currency };
}
