/**
 * BLDC designs: sized by calc's `size-bldc` in a worker thread, stored, simulated, mapped, swept,
 * and linked to register motors (their BLDC options then use the design's part-load curve).
 */
import { Op, literal, type WhereOptions } from 'sequelize';
import type { BldcResult } from '../../calc/bldc/search.js';
import type { SweepRow } from '../../calc/bldc/sweep.js';
import { LAMINATION_STEELS, MAGNET_GRADES } from '../../calc/bldc/materials.js';
import { runEfficiencyMapCommand, type SimulateOutput } from '../../calc/dynamics/commands.js';
import type { EfficiencyMap } from '../../calc/dynamics/efficiency-map.js';
import { iecClassEfficiency, POLES, type Poles } from '../../calc/efficiency/classes.js';
import { database } from '../lib/database.js';
import { badRequest, staleVersion } from '../lib/errors.js';
import { orderFrom, pageWindow } from '../lib/lists.js';
import type { Tenant } from '../lib/tenant.js';
import { BldcDesign, Motor, User } from '../models/index.js';
import type { ListResult } from '../shared/common.js';
import {
  DESIGN_WORKER_TIME_LIMIT_MS,
  type DesignCreate,
  type DesignCreated,
  type DesignListItem,
  type DesignListQuery,
  type DesignOutput,
  type DesignSimulate,
  type SizeBldcInput,
} from '../shared/design.js';
import { customMaterial } from '../settings/service.js';
import { withCalcErrors } from '../studies/calc-errors.js';
import { designCurve } from '../studies/motor-input.js';
import { runCalcInWorker } from './worker-pool.js';

/** Time limit of one BLDC search [ms] (a full search is about 1 s CPU; an infeasible one a few more). */
export const SIZE_TIME_LIMIT_MS = 60_000;

/** Pole count of the induction motor with the nearest synchronous speed at or above `speedRpm`. */
function inductionPoles(speedRpm: number, frequencyHz: 50 | 60): Poles {
  let best: Poles = 4;
  let bestGap = Infinity;
  for (const poles of POLES) {
    const synchronous = (120 * frequencyHz) / poles;
    const gap = synchronous >= speedRpm ? synchronous - speedRpm : (speedRpm - synchronous) * 2;
    if (gap < bestGap) {
      best = poles;
      bestGap = gap;
    }
  }
  return best;
}

/**
 * The size-bldc input as the server runs it: the organisation's custom materials put in by name and,
 * without a minEfficiencyPct, the IE4 efficiency of an induction motor of the same rating and speed
 * (IEC 60034-30-1, calc/efficiency) — cost-optimal designs may otherwise land just below IE4.
 */
async function prepareInput(tenant: Tenant, given: SizeBldcInput, motor: Motor | null, fieldPrefix = ''): Promise<{ input: SizeBldcInput; appliedDefaults: string[] }> {
  const input: SizeBldcInput = { ...given };
  const appliedDefaults: string[] = [];
  if (typeof input.magnet === 'string' && !MAGNET_GRADES.some((grade) => grade.name.toLowerCase() === (input.magnet as string).toLowerCase())) {
    const custom = await customMaterial(tenant, 'magnet', input.magnet);
    if (!custom) throw badRequest(`${fieldPrefix}magnet: must be a grade of the material library`, [{ field: `${fieldPrefix}magnet`, message: 'must be a grade of the material library' }]);
    input.magnet = { ...custom, source: `material library: ${custom.name}` } as SizeBldcInput['magnet'];
    appliedDefaults.push(`magnet: the organisation’s custom grade "${custom.name}"`);
  }
  if (typeof input.steel === 'string' && !LAMINATION_STEELS.some((steel) => steel.name.toLowerCase() === (input.steel as string).toLowerCase())) {
    const custom = await customMaterial(tenant, 'steel', input.steel);
    if (!custom) throw badRequest(`${fieldPrefix}steel: must be a steel of the material library`, [{ field: `${fieldPrefix}steel`, message: 'must be a steel of the material library' }]);
    input.steel = { ...custom, source: `material library: ${custom.name}` } as SizeBldcInput['steel'];
    appliedDefaults.push(`steel: the organisation’s custom steel "${custom.name}"`);
  }
  if (input.minEfficiencyPct === undefined && input.ratedPowerKw >= 0.12 && input.ratedPowerKw <= 1000) {
    const frequencyHz: 50 | 60 = motor?.frequencyHz === 60 || (motor === null && input.frequencyHz === 60) ? 60 : 50;
    const poles = motor && (POLES as readonly number[]).includes(motor.poles) ? (motor.poles as Poles) : inductionPoles(input.speedRpm, frequencyHz);
    const ie4 = iecClassEfficiency(input.ratedPowerKw, poles, frequencyHz, 'IE4');
    input.minEfficiencyPct = ie4.efficiencyPct;
    appliedDefaults.push(
      `minEfficiencyPct ${ie4.efficiencyPct} %: IE4 of a ${input.ratedPowerKw} kW ${poles}-pole ${frequencyHz} Hz motor (${ie4.source}), so the design does not fall below IE4; send minEfficiencyPct to change it`,
    );
  }
  return { input, appliedDefaults };
}

async function userNames(ids: Array<number | null>): Promise<Map<number, string>> {
  const wanted = [...new Set(ids.filter((id): id is number => id !== null))];
  if (wanted.length === 0) return new Map();
  return new Map((await User.findAll({ where: { id: { [Op.in]: wanted } }, attributes: ['id', 'name'] })).map((user) => [user.id, user.name]));
}

interface SummaryColumns {
  slots: number | null;
  poles: number | null;
  frameDesignation: string | null;
  efficiencyPct: number | null;
  systemEfficiencyPct: number | null;
  activeMaterialCost: number | null;
  totalMassKg: number | null;
  limitingConstraint: string | null;
}

/** Figures of the stored result read inside PostgreSQL, so a list does not load whole designs. */
const SUMMARY_ATTRIBUTES: Array<[ReturnType<typeof literal>, keyof SummaryColumns]> = [
  [literal(`(result->>'slots')::int`), 'slots'],
  [literal(`(result->>'poles')::int`), 'poles'],
  [literal(`result->'frame'->>'designation'`), 'frameDesignation'],
  [literal(`(result->>'efficiencyPct')::float8`), 'efficiencyPct'],
  [literal(`(result->>'systemEfficiencyPct')::float8`), 'systemEfficiencyPct'],
  [literal(`(result->>'activeMaterialCost')::float8`), 'activeMaterialCost'],
  [literal(`(result->'massKg'->>'total')::float8`), 'totalMassKg'],
  [literal(`result->>'limitingConstraint'`), 'limitingConstraint'],
];

async function linkedMotors(tenant: Tenant, designIds: number[]): Promise<Map<number, number[]>> {
  const map = new Map<number, number[]>();
  if (designIds.length === 0) return map;
  const motors = await tenant.findAll(Motor, { where: { bldcDesignId: { [Op.in]: designIds } }, attributes: ['id', 'bldcDesignId', 'organizationId'], order: [['id', 'ASC']] });
  for (const motor of motors) map.set(motor.bldcDesignId!, [...(map.get(motor.bldcDesignId!) ?? []), motor.id]);
  return map;
}

async function motorTags(tenant: Tenant, ids: Array<number | null>): Promise<Map<number, string>> {
  const wanted = [...new Set(ids.filter((id): id is number => id !== null))];
  if (wanted.length === 0) return new Map();
  return new Map((await tenant.findAll(Motor, { where: { id: { [Op.in]: wanted } }, attributes: ['id', 'tag', 'organizationId'] })).map((motor) => [motor.id, motor.tag]));
}

function summaryOf(design: BldcDesign, columns: SummaryColumns, tags: Map<number, string>, names: Map<number, string>, links: Map<number, number[]>): DesignListItem {
  return {
    id: design.id,
    name: design.name,
    motorId: design.motorId,
    motorTag: design.motorId === null ? null : (tags.get(design.motorId) ?? null),
    linkedMotorIds: links.get(design.id) ?? [],
    ratedPowerKw: design.ratedPowerKw,
    speedRpm: design.speedRpm,
    feasible: design.feasible,
    limitingConstraint: columns.limitingConstraint ?? '',
    slots: columns.slots,
    poles: columns.poles,
    frame: columns.frameDesignation,
    efficiencyPct: columns.efficiencyPct,
    systemEfficiencyPct: columns.systemEfficiencyPct,
    activeMaterialCost: columns.activeMaterialCost,
    totalMassKg: columns.totalMassKg,
    createdById: design.createdBy,
    createdByName: design.createdBy === null ? null : (names.get(design.createdBy) ?? null),
    createdAt: design.createdAt.toISOString(),
  };
}

function columnsFromResult(result: BldcResult): SummaryColumns {
  return {
    slots: result.slots ?? null,
    poles: result.poles ?? null,
    frameDesignation: result.frame?.designation ?? null,
    efficiencyPct: result.efficiencyPct ?? null,
    systemEfficiencyPct: result.systemEfficiencyPct ?? null,
    activeMaterialCost: result.activeMaterialCost ?? null,
    totalMassKg: result.massKg?.total ?? null,
    limitingConstraint: result.limitingConstraint,
  };
}

export async function createDesign(tenant: Tenant, body: DesignCreate): Promise<DesignCreated> {
  const { name, motorId, ...given } = body;
  const motor = motorId === undefined ? null : await tenant.findById(Motor, motorId, 'Motor');
  const { input, appliedDefaults } = await prepareInput(tenant, given, motor);
  const result = await runCalcInWorker<BldcResult>('size-bldc', input, SIZE_TIME_LIMIT_MS, 'The BLDC search');
  const design = await database().transaction(async (transaction) => {
    const created = await tenant.create(
      BldcDesign,
      {
        motorId: motor?.id ?? null,
        name: name ?? (motor ? `BLDC for ${motor.tag}` : `BLDC ${input.ratedPowerKw} kW ${input.speedRpm} rpm`),
        input: input as Record<string, unknown>,
        appliedDefaults,
        result,
        ratedPowerKw: input.ratedPowerKw,
        speedRpm: input.speedRpm,
        feasible: result.feasible,
        createdBy: tenant.user.id,
      },
      transaction,
    );
    await tenant.audit('create', 'bldc-design', created.id, { name: created.name, motorId: created.motorId, feasible: result.feasible }, transaction);
    return created;
  });
  return { ...result, id: design.id, appliedDefaults };
}

const SORT_COLUMNS: Record<string, string> = { createdAt: 'createdAt', name: 'name', ratedPowerKw: 'ratedPowerKw' };

export async function listDesigns(tenant: Tenant, query: DesignListQuery): Promise<ListResult<DesignListItem>> {
  const where: WhereOptions<BldcDesign> = {};
  if (query.motorId !== undefined) Object.assign(where, { motorId: query.motorId });
  if (query.q) Object.assign(where, { name: { [Op.iLike]: `%${query.q.replace(/[%_\\]/g, '\\$&')}%` } });
  const descending = query.sort.startsWith('-');
  const field = SORT_COLUMNS[descending ? query.sort.slice(1) : query.sort] ?? 'createdAt';
  const { rows, count } = await tenant.findAndCountAll(BldcDesign, {
    where,
    attributes: ['id', 'organizationId', 'motorId', 'name', 'ratedPowerKw', 'speedRpm', 'feasible', 'createdBy', 'createdAt', ...SUMMARY_ATTRIBUTES],
    order: orderFrom(`${descending ? '-' : ''}${field}`),
    ...pageWindow(query.page, query.pageSize),
  });
  const [tags, names, links] = await Promise.all([
    motorTags(tenant, rows.map((row) => row.motorId)),
    userNames(rows.map((row) => row.createdBy)),
    linkedMotors(tenant, rows.map((row) => row.id)),
  ]);
  return {
    items: rows.map((row) => summaryOf(row, row.get({ plain: true }) as unknown as SummaryColumns, tags, names, links)),
    total: count,
    page: query.page,
    pageSize: query.pageSize,
  };
}

export async function getDesign(tenant: Tenant, id: number): Promise<DesignOutput> {
  const design = await tenant.findById(BldcDesign, id, 'Design');
  const [tags, names, links] = await Promise.all([motorTags(tenant, [design.motorId]), userNames([design.createdBy]), linkedMotors(tenant, [design.id])]);
  return { ...summaryOf(design, columnsFromResult(design.result), tags, names, links), input: design.input, appliedDefaults: design.appliedDefaults, result: design.result };
}

export async function simulateDesign(tenant: Tenant, id: number, options: DesignSimulate): Promise<SimulateOutput> {
  const design = await tenant.findById(BldcDesign, id, 'Design');
  const simulationParams = design.result.simulationParams;
  if (!simulationParams) throw badRequest('designId: the design has no simulation parameters (no design could be built)', [{ field: 'id', message: 'has no simulation parameters' }]);
  return runCalcInWorker<SimulateOutput>('simulate', { ...options, design: { simulationParams } }, DESIGN_WORKER_TIME_LIMIT_MS, 'The simulation');
}

export async function efficiencyMapOfDesign(tenant: Tenant, id: number, axes: { speedsRpm: number[]; torquesNm: number[] }): Promise<EfficiencyMap> {
  const design = await tenant.findById(BldcDesign, id, 'Design');
  const lossModel = design.result.lossModel;
  if (!lossModel) throw badRequest('designId: the design has no loss model (no design could be built)', [{ field: 'id', message: 'has no loss model' }]);
  // 200 × 200 points at most: a few milliseconds, no worker needed.
  return withCalcErrors(() => runEfficiencyMapCommand({ design: { lossModel }, ...axes }));
}

export async function sweepDesign(tenant: Tenant, body: { base: unknown; parameter: string; from: number; to: number; steps: number }): Promise<{ parameter: string; rows: SweepRow[] }> {
  let base = body.base;
  if (typeof base === 'object' && base !== null && !Array.isArray(base)) {
    const candidate = base as SizeBldcInput;
    if (typeof candidate.ratedPowerKw === 'number' && typeof candidate.speedRpm === 'number') base = (await prepareInput(tenant, candidate, null, 'base.')).input;
  }
  return runCalcInWorker<{ parameter: string; rows: SweepRow[] }>('sweep', { ...body, base }, DESIGN_WORKER_TIME_LIMIT_MS, 'The sweep');
}

/**
 * Makes a design the motor's BLDC option (or unlinks with null). The design must be feasible, with a
 * part-load curve, and rated within 10 % of the motor: its curve is read as a fraction of rated load.
 */
export async function linkMotorDesign(tenant: Tenant, motorId: number, designId: number | null, version: number | undefined) {
  return database().transaction(async (transaction) => {
    const motor = await tenant.findById(Motor, motorId, 'Motor', { transaction, lock: transaction.LOCK.UPDATE });
    if (version !== undefined && motor.version !== version) throw staleVersion('This motor');
    if (designId !== null) {
      const design = await tenant.findById(BldcDesign, designId, 'Design', { transaction });
      if (!designCurve(design)) {
        throw badRequest(`designId: design #${designId} is not feasible (${design.result.limitingConstraint}); only a feasible design can stand for the motor`, [
          { field: 'designId', message: 'is not feasible' },
        ]);
      }
      const ratio = design.ratedPowerKw / motor.ratedPowerKw;
      if (ratio < 0.9 || ratio > 1.1) {
        throw badRequest(`designId: design #${designId} is rated ${design.ratedPowerKw} kW; the motor ${motor.ratedPowerKw} kW (must be within 10 %)`, [
          { field: 'designId', message: 'rating differs from the motor’s by more than 10 %' },
        ]);
      }
    }
    const [updated] = await Motor.update({ bldcDesignId: designId, version: motor.version + 1 }, { where: tenant.where<Motor>({ id: motorId, version: motor.version }), transaction });
    if (updated === 0) throw staleVersion('This motor');
    await tenant.audit(designId === null ? 'unlink-design' : 'link-design', 'motor', motorId, { bldcDesignId: designId }, transaction);
    return { motorId, designId, version: motor.version + 1 };
  });
}
