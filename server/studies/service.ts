/**
 * Quick studies: one motor assessed by calc's `assess` against every retrofit option. The server
 * recomputes every saved study from its input, so a stored result is exactly what the command line
 * (`npm run calc -- assess`) answers for the stored input.
 */
import { Op, literal, type WhereOptions } from 'sequelize';
import { assess, type AssessResult } from '../../calc/assess/assess.js';
import type { AssessInput } from '../../calc/assess/schema.js';
import { database } from '../lib/database.js';
import { orderFrom, pageWindow } from '../lib/lists.js';
import type { Tenant } from '../lib/tenant.js';
import { BldcDesign, Motor, Site, Study, User } from '../models/index.js';
import type { ListResult } from '../shared/common.js';
import type { StudyCreate, StudyCreated, StudyListItem, StudyListQuery, StudyOutput, StudyPreview } from '../shared/study.js';
import { storedAssessSettings } from '../settings/service.js';
import { withCalcErrors } from './calc-errors.js';
import { assessInputForMotor } from './motor-input.js';

/** Runs calc's assess on a parsed input; a CalcInputError becomes a 400 naming the field. */
export function runAssess(input: AssessInput): AssessResult {
  return withCalcErrors(() => assess(input.motor, input.site, input.priceBook, input.assumptions));
}

/** The recommended option's figures, or zeros when the recommendation is to keep the motor. */
function recommendedFigures(result: AssessResult) {
  const option = result.options.find((candidate) => candidate.code === result.recommended.code);
  const keep = result.recommended.code === 'keep' || !option;
  return {
    code: result.recommended.code,
    label: option?.label ?? result.baseline.label,
    savingsKwh: keep ? 0 : option.savingsKwh,
    savingsCost: keep ? 0 : option.savingsCost,
    npv: keep ? 0 : option.npv,
  };
}

async function userNames(ids: Array<number | null>): Promise<Map<number, string>> {
  const wanted = [...new Set(ids.filter((id): id is number => id !== null))];
  if (wanted.length === 0) return new Map();
  const users = await User.findAll({ where: { id: { [Op.in]: wanted } }, attributes: ['id', 'name'] });
  return new Map(users.map((user) => [user.id, user.name]));
}

async function motorTags(tenant: Tenant, ids: Array<number | null>): Promise<Map<number, string>> {
  const wanted = [...new Set(ids.filter((id): id is number => id !== null))];
  if (wanted.length === 0) return new Map();
  const motors = await tenant.findAll(Motor, { where: { id: { [Op.in]: wanted } }, attributes: ['id', 'tag', 'organizationId'] });
  return new Map(motors.map((motor) => [motor.id, motor.tag]));
}

function summary(study: Study, tags: Map<number, string>, names: Map<number, string>): StudyListItem {
  const figures = recommendedFigures(study.result);
  return {
    id: study.id,
    name: study.name,
    motorId: study.motorId,
    motorTag: study.motorId === null ? (study.input.motor.tag ?? null) : (tags.get(study.motorId) ?? null),
    siteName: study.input.site.name ?? null,
    ratedPowerKw: study.input.motor.ratedPowerKw,
    currency: study.result.currency,
    recommendedCode: figures.code,
    recommendedLabel: figures.label,
    savingsKwh: figures.savingsKwh,
    savingsCost: figures.savingsCost,
    npv: figures.npv,
    createdById: study.createdBy,
    createdByName: study.createdBy === null ? null : (names.get(study.createdBy) ?? null),
    createdAt: study.createdAt.toISOString(),
  };
}

/**
 * Saves a study: the organisation's price book and assumptions fill what the input leaves out
 * (calc's defaults fill the rest), calc recomputes, input and result are stored.
 */
export async function createStudy(tenant: Tenant, body: StudyCreate): Promise<StudyCreated> {
  const { name, motorId, ...given } = body;
  const motor = motorId === undefined ? null : await tenant.findById(Motor, motorId, 'Motor');
  const settings = await storedAssessSettings(tenant);
  const input: AssessInput = { motor: given.motor, site: given.site };
  const priceBook = given.priceBook ?? settings.priceBook;
  const assumptions = given.assumptions ?? settings.assumptions;
  if (priceBook) input.priceBook = priceBook;
  if (assumptions) input.assumptions = assumptions;
  const result = runAssess(input);
  const figures = recommendedFigures(result);
  const study = await database().transaction(async (transaction) => {
    const created = await tenant.create(
      Study,
      {
        motorId: motor?.id ?? null,
        name: name ?? motor?.tag ?? given.motor.tag ?? `${given.motor.ratedPowerKw} kW motor`,
        input,
        result,
        recommendedCode: figures.code,
        savingsKwh: figures.savingsKwh,
        savingsCost: String(figures.savingsCost),
        npv: String(figures.npv),
        createdBy: tenant.user.id,
      },
      transaction,
    );
    await tenant.audit('create', 'study', created.id, { name: created.name, motorId: created.motorId, recommended: figures.code }, transaction);
    return created;
  });
  return { ...result, id: study.id };
}

/** The assessment of a register motor, not saved: the input it was built from and calc's result. */
export async function previewFromMotor(tenant: Tenant, motorId: number): Promise<StudyPreview> {
  const motor = await tenant.findById(Motor, motorId, 'Motor');
  const site = await tenant.findById(Site, motor.siteId, 'Site');
  const design = motor.bldcDesignId === null ? null : await BldcDesign.findOne({ where: tenant.where<BldcDesign>({ id: motor.bldcDesignId }) });
  const { input, sources, bldcDesignId } = assessInputForMotor(motor, site, await storedAssessSettings(tenant), design);
  return { input, result: runAssess(input), bldcDesignId, sources };
}

const SORT_COLUMNS: Record<string, string> = { createdAt: 'createdAt', name: 'name', savingsCost: 'savingsCost', npv: 'npv' };

export async function listStudies(tenant: Tenant, query: StudyListQuery): Promise<ListResult<StudyListItem>> {
  const where: WhereOptions<Study> = {};
  if (query.motorId !== undefined) Object.assign(where, { motorId: query.motorId });
  if (query.q) {
    const pattern = `%${query.q.replace(/[%_\\]/g, '\\$&')}%`;
    Object.assign(where, { [Op.or]: [{ name: { [Op.iLike]: pattern } }, literal(`input->'motor'->>'tag' ILIKE ${database().escape(pattern)}`)] });
  }
  const descending = query.sort.startsWith('-');
  const field = SORT_COLUMNS[descending ? query.sort.slice(1) : query.sort] ?? 'createdAt';
  const { rows, count } = await tenant.findAndCountAll(Study, {
    where,
    order: orderFrom(`${descending ? '-' : ''}${field}`),
    ...pageWindow(query.page, query.pageSize),
  });
  const [tags, names] = await Promise.all([motorTags(tenant, rows.map((row) => row.motorId)), userNames(rows.map((row) => row.createdBy))]);
  return { items: rows.map((row) => summary(row, tags, names)), total: count, page: query.page, pageSize: query.pageSize };
}

export async function getStudy(tenant: Tenant, id: number): Promise<StudyOutput> {
  const study = await tenant.findById(Study, id, 'Study');
  const [tags, names] = await Promise.all([motorTags(tenant, [study.motorId]), userNames([study.createdBy])]);
  return { ...summary(study, tags, names), input: study.input, result: study.result };
}

export async function deleteStudy(tenant: Tenant, id: number): Promise<void> {
  await database().transaction(async (transaction) => {
    const study = await tenant.findById(Study, id, 'Study', { transaction });
    await study.destroy({ transaction });
    await tenant.audit('delete', 'study', id, { name: study.name }, transaction);
  });
}
