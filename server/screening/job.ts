/**
 * The screening job: every matching motor of a site assessed by calc's `assess`, each motor's paying
 * options kept, the budget knapsack solved, rows ranked. Runs in the job runner (server/jobs).
 */
import { Op, type WhereOptions } from 'sequelize';
import { assess, type AssessResult, type OptionResult } from '../../calc/assess/assess.js';
import { CalcInputError } from '../../calc/errors.js';
import { AppError } from '../lib/errors.js';
import type { JobContext } from '../jobs/runner.js';
import { BldcDesign, Motor, Site } from '../models/index.js';
import type { ScreeningFilters, ScreeningResult, ScreeningRow, ScreeningStart, ScreeningTotals } from '../shared/screening.js';
import { storedAssessSettings } from '../settings/service.js';
import { assessInputForMotor } from '../studies/motor-input.js';
import { solveBudgetKnapsack } from './knapsack.js';

/** Parameters stored with a screening job. */
export interface ScreeningParams extends ScreeningStart {
  siteId: number;
}

/** Motors between progress reports. */
const PROGRESS_EVERY = 10;

const list = <T>(value: T | T[] | undefined): T[] | undefined => (value === undefined ? undefined : Array.isArray(value) ? value : [value]);

/** The register's motors of a site that a screening covers: not retired, and the filters. */
export function screeningWhere(organizationId: number, siteId: number, filters: ScreeningFilters | undefined): WhereOptions<Motor> {
  const where: Record<string | symbol, unknown> = { organizationId, siteId, status: { [Op.ne]: 'retired' } };
  if (filters?.area) where.area = filters.area;
  const applications = list(filters?.application);
  if (applications) where.application = { [Op.in]: applications };
  const classes = list(filters?.efficiencyClass);
  if (classes) where.efficiencyClass = { [Op.in]: classes };
  if (filters?.minKw !== undefined || filters?.maxKw !== undefined) {
    where.ratedPowerKw = { ...(filters.minKw !== undefined ? { [Op.gte]: filters.minKw } : {}), ...(filters.maxKw !== undefined ? { [Op.lte]: filters.maxKw } : {}) };
  }
  return where as WhereOptions<Motor>;
}

interface Assessed {
  motor: Motor;
  result: AssessResult;
  /** Options with a positive NPV, best NPV first. */
  paying: OptionResult[];
  usesBldcDesign: boolean;
}

function row(entry: Assessed, option: OptionResult | undefined, selected: boolean): Omit<ScreeningRow, 'rank'> {
  const { motor, result } = entry;
  return {
    motorId: motor.id,
    tag: motor.tag,
    area: motor.area,
    application: motor.application,
    ratedPowerKw: motor.ratedPowerKw,
    optionCode: option?.code ?? null,
    optionLabel: option?.label ?? null,
    recommendedCode: result.recommended.code,
    annualKwhSaved: option?.savingsKwh ?? 0,
    costSaved: option?.savingsCost ?? 0,
    co2SavedKg: option?.co2SavedKg ?? 0,
    kvaFreed: option?.kvaReduction ?? 0,
    lineCurrentFreedA: option?.lineCurrentReductionA ?? 0,
    capex: option?.capex ?? 0,
    paybackYears: option?.simplePaybackYears ?? null,
    npv: option?.npv ?? 0,
    irr: option?.irr ?? null,
    selected,
    usesBldcDesign: entry.usesBldcDesign,
    candidates: entry.paying.map((candidate) => ({ code: candidate.code, capex: candidate.capex, npv: candidate.npv, simplePaybackYears: candidate.simplePaybackYears })),
  };
}

const sum = (rows: readonly Omit<ScreeningRow, 'rank'>[], pick: (row: Omit<ScreeningRow, 'rank'>) => number, decimals: number) => {
  const scale = 10 ** decimals;
  return Math.round(rows.reduce((total, entry) => total + Math.round(pick(entry) * scale), 0)) / scale;
};

function totalsOf(selected: readonly Omit<ScreeningRow, 'rank'>[]): ScreeningTotals {
  return {
    motors: selected.length,
    annualKwhSaved: sum(selected, (r) => r.annualKwhSaved, 1),
    costSaved: sum(selected, (r) => r.costSaved, 2),
    co2SavedKg: sum(selected, (r) => r.co2SavedKg, 1),
    kvaFreed: sum(selected, (r) => r.kvaFreed, 3),
    capex: sum(selected, (r) => r.capex, 2),
    npv: sum(selected, (r) => r.npv, 2),
  };
}

/** Ranking: NPV high to low, or simple payback short to long; rows with no paying option last. */
function compareRows(rankBy: 'npv' | 'payback') {
  return (a: Omit<ScreeningRow, 'rank'>, b: Omit<ScreeningRow, 'rank'>) => {
    if ((a.optionCode === null) !== (b.optionCode === null)) return a.optionCode === null ? 1 : -1;
    if (rankBy === 'payback') {
      const pa = a.paybackYears ?? Infinity;
      const pb = b.paybackYears ?? Infinity;
      if (pa !== pb) return pa - pb;
    }
    return b.npv - a.npv || a.tag.localeCompare(b.tag);
  };
}

/** Runs one screening; progress is reported every PROGRESS_EVERY motors. */
export async function runScreening(context: JobContext): Promise<ScreeningResult> {
  const params = context.job.params as unknown as ScreeningParams;
  const organizationId = context.job.organizationId;
  const site = await Site.findOne({ where: { id: params.siteId, organizationId } });
  if (!site) throw new AppError('not-found', 'Site was not found.', 404);
  const motors = await Motor.findAll({ where: screeningWhere(organizationId, site.id, params.filters), order: [['tag', 'ASC']] });
  const designIds = [...new Set(motors.map((motor) => motor.bldcDesignId).filter((id): id is number => id !== null))];
  const designs = new Map(
    (designIds.length > 0 ? await BldcDesign.findAll({ where: { organizationId, id: { [Op.in]: designIds } } }) : []).map((design) => [design.id, design]),
  );
  const settings = await storedAssessSettings({ organizationId });

  const assessed: Assessed[] = [];
  const failed: ScreeningResult['failed'] = [];
  for (let index = 0; index < motors.length; index += 1) {
    if (index % PROGRESS_EVERY === 0) await context.progress((0.95 * index) / Math.max(1, motors.length));
    const motor = motors[index]!;
    const design = motor.bldcDesignId === null ? null : (designs.get(motor.bldcDesignId) ?? null);
    const { input, bldcDesignId } = assessInputForMotor(motor, site, settings, design);
    try {
      // Totals only: the screening needs no per-bin operating points (calc's 'totals' detail).
      const result = assess(input.motor, input.site, input.priceBook, input.assumptions, { detail: 'totals' });
      const paying = result.options.filter((option) => option.code !== 'keep' && option.npv > 0).sort((a, b) => b.npv - a.npv);
      assessed.push({ motor, result, paying, usesBldcDesign: bldcDesignId !== null });
    } catch (error) {
      if (!(error instanceof CalcInputError)) throw error;
      failed.push({ motorId: motor.id, tag: motor.tag, message: error.message.replace(/^"([^"]*)" /, '$1: ') });
    }
  }
  await context.progress(0.96);

  let rows: Omit<ScreeningRow, 'rank'>[];
  let exact = true;
  let method: string;
  if (params.budget !== undefined) {
    const solution = solveBudgetKnapsack(
      assessed.map((entry) => entry.paying.map((option) => ({ capex: option.capex, value: option.npv }))),
      params.budget,
    );
    exact = solution.exact;
    method = 'multiple-choice knapsack on capex maximising total NPV (dynamic programme over the Pareto frontier, in cents)';
    rows = assessed.map((entry, index) => {
      const pick = solution.picks[index];
      const option = pick === null || pick === undefined ? entry.paying[0] : entry.paying[pick];
      return row(entry, option, pick !== null && pick !== undefined);
    });
  } else {
    method = 'no budget: every motor’s option of highest NPV, when positive';
    rows = assessed.map((entry) => row(entry, entry.paying[0], entry.paying.length > 0));
  }
  rows.sort(compareRows(params.rankBy));
  await context.progress(0.99);
  return {
    siteId: site.id,
    siteName: site.name,
    currency: site.currency,
    budget: params.budget ?? null,
    rankBy: params.rankBy,
    filters: (params.filters ?? {}) as Record<string, unknown>,
    motorCount: motors.length,
    failed,
    rows: rows.map((entry, index) => ({ rank: index + 1, ...entry })),
    totals: totalsOf(rows.filter((entry) => entry.selected)),
    selection: { method, exact },
  };
}
