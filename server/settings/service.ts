/**
 * Settings of an organisation: the price book and assumptions its admin stored, falling back to
 * calc's defaults part by part, and the BLDC material library (calc/bldc's built-in grades plus the
 * organisation's custom magnets and steels).
 */
import { Op, UniqueConstraintError, type Transaction } from 'sequelize';
import type { z } from 'zod';
import type { AssumptionsInput, PriceBookInput } from '../../calc/assess/schema.js';
import {
  DEFAULT_DISCOUNT_RATE_PCT,
  DEFAULT_ENERGY_ESCALATION_PCT,
  DEFAULT_GRID_CO2_KG_PER_KWH,
  DEFAULT_HOURS_PER_YEAR,
  DEFAULT_LOAD_FACTOR,
  DEFAULT_NEW_DRIVE_CLASS,
  DEFAULT_OPTION_LIFE_YEARS,
} from '../../calc/assess/defaults.js';
import { LAMINATION_STEELS, MAGNET_GRADES, resolveMagnet, resolveSteel, type LaminationSteel, type MagnetGrade } from '../../calc/bldc/materials.js';
import { UNKNOWN_CLASS_LOSS_FACTOR_TO_IE1 } from '../../calc/efficiency/classes.js';
import { REWIND_PENALTY_PCT_POINTS } from '../../calc/efficiency/part-load.js';
import { DEFAULT_PRICE_BOOK, PRICE_ITEMS, type PriceBook } from '../../calc/economics/price-book.js';
import { database } from '../lib/database.js';
import { badRequest, conflict, staleVersion } from '../lib/errors.js';
import type { Tenant } from '../lib/tenant.js';
import { Material, OrganizationSettings } from '../models/index.js';
import {
  magnetShape,
  steelShape,
  type MagnetOutput,
  type MaterialCreate,
  type MaterialKind,
  type MaterialOutput,
  type MaterialUpdate,
  type SettingsOutput,
  type SteelOutput,
  type assumptionsUpdateBody,
  type priceBookUpdateBody,
} from '../shared/settings.js';
import { CalcInputError } from '../../calc/errors.js';
import { calcInputToAppError } from '../studies/calc-errors.js';

/** What the organisation stored, as calc's `assess` takes it (undefined parts: calc's defaults). */
export interface StoredAssessSettings {
  priceBook?: PriceBookInput;
  assumptions?: AssumptionsInput;
}

export async function storedAssessSettings(tenant: Tenant | { organizationId: number }, transaction?: Transaction): Promise<StoredAssessSettings> {
  const row = await OrganizationSettings.findOne({ where: { organizationId: tenant.organizationId }, ...(transaction ? { transaction } : {}) });
  const settings: StoredAssessSettings = {};
  if (row?.priceBook) settings.priceBook = row.priceBook;
  if (row?.assumptions) settings.assumptions = row.assumptions;
  return settings;
}

/** The complete price book in use and the parts that came from DEFAULT_PRICE_BOOK (as calc merges it). */
function effectivePriceBook(stored: PriceBookInput | null): { value: PriceBook; defaulted: string[] } {
  const defaulted: string[] = [];
  const items = { ...DEFAULT_PRICE_BOOK.items };
  for (const item of PRICE_ITEMS) {
    const bands = stored?.items?.[item];
    if (bands) items[item] = bands;
    else defaulted.push(`items.${item}`);
  }
  if (!stored?.motorInstallation) defaulted.push('motorInstallation');
  if (!stored?.driveInstallation) defaulted.push('driveInstallation');
  if (!stored?.rebates) defaulted.push('rebates');
  const value: PriceBook = {
    items,
    motorInstallation: stored?.motorInstallation ?? DEFAULT_PRICE_BOOK.motorInstallation,
    driveInstallation: stored?.driveInstallation ?? DEFAULT_PRICE_BOOK.driveInstallation,
    rebates: stored?.rebates ?? DEFAULT_PRICE_BOOK.rebates ?? {},
  };
  if (stored?.currency) value.currency = stored.currency;
  return { value, defaulted };
}

/** calc's default of every assumption (calc/assess/defaults.ts and the efficiency domain). */
export const DEFAULT_ASSUMPTIONS = {
  discountRatePct: DEFAULT_DISCOUNT_RATE_PCT,
  energyEscalationPct: DEFAULT_ENERGY_ESCALATION_PCT,
  lifeYears: { ...DEFAULT_OPTION_LIFE_YEARS },
  rewindPenaltyPctPoints: REWIND_PENALTY_PCT_POINTS,
  defaultHoursPerYear: DEFAULT_HOURS_PER_YEAR,
  defaultLoadFactor: DEFAULT_LOAD_FACTOR,
  unknownClassLossFactor: UNKNOWN_CLASS_LOSS_FACTOR_TO_IE1,
  newDriveClass: DEFAULT_NEW_DRIVE_CLASS,
  co2KgPerKwh: DEFAULT_GRID_CO2_KG_PER_KWH,
} as const;

function effectiveAssumptions(stored: AssumptionsInput | null): { value: Record<string, unknown>; defaulted: string[] } {
  const value: Record<string, unknown> = {};
  const defaulted: string[] = [];
  for (const [key, fallback] of Object.entries(DEFAULT_ASSUMPTIONS)) {
    const given = stored?.[key as keyof AssumptionsInput];
    if (key === 'lifeYears') {
      const lives = { ...DEFAULT_OPTION_LIFE_YEARS, ...(stored?.lifeYears ?? {}) };
      value.lifeYears = lives;
      for (const option of Object.keys(DEFAULT_OPTION_LIFE_YEARS)) {
        if (stored?.lifeYears?.[option as keyof typeof DEFAULT_OPTION_LIFE_YEARS] === undefined) defaulted.push(`lifeYears.${option}`);
      }
      continue;
    }
    value[key] = given ?? fallback;
    if (given === undefined) defaulted.push(key);
  }
  return { value, defaulted };
}

// Material library -------------------------------------------------------------------------------

function builtInMagnet(grade: MagnetGrade): MagnetOutput {
  return { ...grade, id: null, kind: 'magnet', builtIn: true, version: 0 };
}
function builtInSteel(steel: LaminationSteel): SteelOutput {
  return { ...steel, id: null, kind: 'steel', builtIn: true, version: 0 };
}

function materialToOutput(row: Material): MaterialOutput {
  const base = { ...row.properties, name: row.name, id: row.id, builtIn: false, version: row.version };
  return row.kind === 'magnet' ? ({ ...base, kind: 'magnet' } as MagnetOutput) : ({ ...base, kind: 'steel' } as SteelOutput);
}

/** The organisation's custom material of this kind and name (case-insensitive), as calc takes it. */
export async function customMaterial(tenant: Tenant, kind: MaterialKind, name: string): Promise<MagnetGrade | LaminationSteel | null> {
  const row = await Material.findOne({ where: tenant.where<Material>({ kind, name: { [Op.iLike]: name.replace(/[%_\\]/g, '\\$&') } }) });
  if (!row) return null;
  return { ...row.properties, name: row.name } as unknown as MagnetGrade | LaminationSteel;
}

export async function getSettings(tenant: Tenant): Promise<SettingsOutput> {
  const row = await OrganizationSettings.findOne({ where: { organizationId: tenant.organizationId } });
  const priceBook = effectivePriceBook(row?.priceBook ?? null);
  const assumptions = effectiveAssumptions(row?.assumptions ?? null);
  const custom = await tenant.findAll(Material, { order: [['name', 'ASC']] });
  return {
    priceBook: { value: priceBook.value, stored: row?.priceBook ?? null, defaulted: priceBook.defaulted, version: row?.priceBookVersion ?? 0 },
    assumptions: { value: assumptions.value, stored: row?.assumptions ?? null, defaulted: assumptions.defaulted, version: row?.assumptionsVersion ?? 0 },
    materials: {
      magnets: [...MAGNET_GRADES.map(builtInMagnet), ...custom.filter((m) => m.kind === 'magnet').map((m) => materialToOutput(m) as MagnetOutput)],
      steels: [...LAMINATION_STEELS.map(builtInSteel), ...custom.filter((m) => m.kind === 'steel').map((m) => materialToOutput(m) as SteelOutput)],
    },
  };
}

/** Drops the version and undefined fields: what is stored. */
function storedValue<T extends { version: number }>(body: T): Omit<T, 'version'> {
  const { version: _version, ...rest } = body;
  return Object.fromEntries(Object.entries(rest).filter(([, value]) => value !== undefined)) as Omit<T, 'version'>;
}

async function updateSettingsPart(
  tenant: Tenant,
  part: 'priceBook' | 'assumptions',
  value: Record<string, unknown>,
  version: number,
): Promise<SettingsOutput> {
  await database().transaction(async (transaction) => {
    await OrganizationSettings.findOrCreate({ where: { organizationId: tenant.organizationId }, defaults: { organizationId: tenant.organizationId }, transaction });
    const versionColumn = part === 'priceBook' ? 'priceBookVersion' : 'assumptionsVersion';
    const [updated] = await OrganizationSettings.update(
      { [part]: value, [versionColumn]: version + 1 },
      { where: { organizationId: tenant.organizationId, [versionColumn]: version }, transaction },
    );
    if (updated === 0) throw staleVersion(part === 'priceBook' ? 'The price book' : 'The assumptions');
    await tenant.audit('update', part === 'priceBook' ? 'price-book' : 'assumptions', null, value, transaction);
  });
  return getSettings(tenant);
}

export function updatePriceBook(tenant: Tenant, body: z.infer<typeof priceBookUpdateBody>): Promise<SettingsOutput> {
  return updateSettingsPart(tenant, 'priceBook', storedValue(body), body.version);
}

export function updateAssumptions(tenant: Tenant, body: z.infer<typeof assumptionsUpdateBody>): Promise<SettingsOutput> {
  return updateSettingsPart(tenant, 'assumptions', storedValue(body), body.version);
}

/** Checks a material with calc/bldc's own rules (resolveMagnet / resolveSteel), naming the field. */
function checkMaterial(kind: MaterialKind, material: Record<string, unknown>): void {
  try {
    if (kind === 'magnet') resolveMagnet(material as unknown as MagnetGrade);
    else resolveSteel(material as unknown as LaminationSteel);
  } catch (error) {
    // calc names the field inside its `magnet`/`steel` input; here the material is the whole body.
    if (error instanceof CalcInputError) throw calcInputToAppError(new CalcInputError(error.field.replace(/^(magnet|steel)\.?/, '') || 'name', error.message.replace(/^"[^"]*" /, '')));
    throw error;
  }
}

function refuseBuiltInName(kind: MaterialKind, name: string): void {
  const builtIn = (kind === 'magnet' ? MAGNET_GRADES : LAMINATION_STEELS).some((grade) => grade.name.toLowerCase() === name.toLowerCase());
  if (builtIn) throw conflict('material-name-taken', `name: "${name}" is a built-in ${kind} grade; choose another name`, [{ field: 'name', message: 'is a built-in grade' }]);
}

function nameTaken(kind: MaterialKind, name: string) {
  return conflict('material-name-taken', `name: a custom ${kind} called "${name}" already exists`, [{ field: 'name', message: 'is taken' }]);
}

export async function createMaterial(tenant: Tenant, body: MaterialCreate): Promise<MaterialOutput> {
  const { kind, name, ...properties } = body;
  refuseBuiltInName(kind, name);
  checkMaterial(kind, { ...properties, name });
  if (await customMaterial(tenant, kind, name)) throw nameTaken(kind, name);
  try {
    const row = await database().transaction(async (transaction) => {
      const created = await tenant.create(Material, { kind, name, properties, createdBy: tenant.user.id }, transaction);
      await tenant.audit('create', 'material', created.id, body, transaction);
      return created;
    });
    return materialToOutput(row);
  } catch (error) {
    if (error instanceof UniqueConstraintError) throw nameTaken(kind, name);
    throw error;
  }
}

export async function updateMaterial(tenant: Tenant, id: number, body: MaterialUpdate): Promise<MaterialOutput> {
  const { version, name, ...changes } = body;
  return database().transaction(async (transaction) => {
    const row = await tenant.findById(Material, id, 'Material', { transaction });
    const shape = row.kind === 'magnet' ? magnetShape : steelShape;
    const merged = { ...row.properties, ...Object.fromEntries(Object.entries(changes).filter(([, value]) => value !== undefined)), name: name ?? row.name };
    // A field of the other kind (a steel's thicknessM on a magnet) is refused by the kind's strict shape.
    const parsed = shape.strict().safeParse(merged);
    if (!parsed.success) {
      const issue = parsed.error.issues[0]!;
      const field = issue.path.length > 0 ? issue.path.join('.') : 'body';
      throw badRequest(`${field}: ${issue.code === 'unrecognized_keys' ? `is not a field of a ${row.kind}` : issue.message}`, [{ field, message: issue.message }]);
    }
    const { name: newName, ...properties } = parsed.data as Record<string, unknown> & { name: string };
    if (newName.toLowerCase() !== row.name.toLowerCase()) {
      refuseBuiltInName(row.kind, newName);
      if (await customMaterial(tenant, row.kind, newName)) throw nameTaken(row.kind, newName);
    }
    checkMaterial(row.kind, { ...properties, name: newName });
    const [updated] = await Material.update({ name: newName, properties, version: version + 1 }, { where: tenant.where<Material>({ id, version }), transaction });
    if (updated === 0) throw staleVersion('This material');
    await tenant.audit('update', 'material', id, body, transaction);
    return materialToOutput((await tenant.findById(Material, id, 'Material', { transaction })));
  });
}

export async function deleteMaterial(tenant: Tenant, id: number, version: number | undefined): Promise<void> {
  await database().transaction(async (transaction) => {
    const row = await tenant.findById(Material, id, 'Material', { transaction });
    if (version !== undefined && row.version !== version) throw staleVersion('This material');
    await row.destroy({ transaction });
    await tenant.audit('delete', 'material', id, { kind: row.kind, name: row.name }, transaction);
  });
}
