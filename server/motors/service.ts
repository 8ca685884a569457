/**
 * Motors: the register of an organisation's motors, their field measurements, files and history.
 * Every read and write goes through the organisation's Tenant; edits carry the version the editor
 * loaded (409 stale-version otherwise); every change is audited in the same transaction.
 *
 * DELETE retires a motor (status `retired`) rather than removing the row: its history, measurements
 * and files stay, and later studies and retrofits that refer to it keep working. Retired motors
 * leave the default register list (filter `status=retired` shows them); PATCH `status` restores one.
 */
import { Op, UniqueConstraintError, type Transaction } from 'sequelize';
import type { z } from 'zod';
import { database } from '../lib/database.js';
import { AppError, conflict, staleVersion } from '../lib/errors.js';
import { orderFrom, pageWindow } from '../lib/lists.js';
import type { Tenant } from '../lib/tenant.js';
import { AuditLog, Motor, MotorMeasurement, Site, User } from '../models/index.js';
import type { ListResult } from '../shared/common.js';
import type {
  MeasurementCreate,
  MeasurementOutput,
  MotorCreate,
  MotorHistoryItem,
  MotorListQuery,
  MotorOutput,
  MotorUpdate,
  motorHistoryQuery,
} from '../shared/motor.js';
import { motorWhere } from './filters.js';

export function toMotorOutput(motor: Motor, siteName: string): MotorOutput {
  return {
    id: motor.id,
    siteId: motor.siteId,
    siteName,
    tag: motor.tag,
    description: motor.description,
    area: motor.area,
    application: motor.application,
    ratedPowerKw: motor.ratedPowerKw,
    speedRpm: motor.speedRpm,
    poles: motor.poles,
    voltageV: motor.voltageV,
    frequencyHz: motor.frequencyHz,
    ratedCurrentA: motor.ratedCurrentA,
    efficiencyClass: motor.efficiencyClass,
    nameplateEfficiencyPct: motor.nameplateEfficiencyPct,
    powerFactor: motor.powerFactor,
    frame: motor.frame,
    enclosure: motor.enclosure,
    manufacturer: motor.manufacturer,
    yearInstalled: motor.yearInstalled,
    rewinds: motor.rewinds,
    controlMethod: motor.controlMethod,
    hoursPerYear: motor.hoursPerYear,
    loadFactor: motor.loadFactor,
    dutyProfile: motor.dutyProfile,
    status: motor.status,
    notes: motor.notes,
    importBatchId: motor.importBatchId,
    version: motor.version,
    createdAt: motor.createdAt.toISOString(),
    updatedAt: motor.updatedAt.toISOString(),
  };
}

/** Site names by id, for the rows of one page. */
export async function siteNames(tenant: Tenant, siteIds: number[]): Promise<Map<number, string>> {
  const unique = [...new Set(siteIds)];
  if (unique.length === 0) return new Map();
  const sites = await tenant.findAll(Site, { where: { id: { [Op.in]: unique } }, attributes: ['id', 'name', 'organizationId'] });
  return new Map(sites.map((site) => [site.id, site.name]));
}

export async function listMotors(tenant: Tenant, query: MotorListQuery): Promise<ListResult<MotorOutput>> {
  const where = motorWhere(query);
  const [rows, total] = await Promise.all([
    tenant.findAll(Motor, { where, order: orderFrom(query.sort), ...pageWindow(query.page, query.pageSize) }),
    tenant.count(Motor, { where }),
  ]);
  const names = await siteNames(tenant, rows.map((motor) => motor.siteId));
  return { items: rows.map((motor) => toMotorOutput(motor, names.get(motor.siteId) ?? '')), total, page: query.page, pageSize: query.pageSize };
}

export async function getMotor(tenant: Tenant, id: number, transaction?: Transaction): Promise<MotorOutput> {
  const motor = await tenant.findById(Motor, id, 'Motor', transaction ? { transaction } : {});
  const site = await tenant.findById(Site, motor.siteId, 'Site', transaction ? { transaction } : {});
  return toMotorOutput(motor, site.name);
}

/** The site must be this organisation's: another's is reported as a bad siteId, not found. */
async function requireSite(tenant: Tenant, siteId: number, transaction: Transaction): Promise<Site> {
  const site = await Site.findOne({ where: tenant.where<Site>({ id: siteId }), transaction });
  if (!site) throw new AppError('invalid-input', 'siteId: no such site', 400, [{ field: 'siteId', message: 'no such site' }]);
  return site;
}

function duplicateTag(tag: string) {
  return conflict('duplicate-tag', `tag: ${tag} is already used by another motor at this site`, [{ field: 'tag', message: 'is already used at this site' }]);
}

export async function createMotor(tenant: Tenant, input: MotorCreate): Promise<MotorOutput> {
  try {
    const id = await database().transaction(async (transaction) => {
      await requireSite(tenant, input.siteId, transaction);
      const created = await tenant.create(
        Motor,
        {
          ...input,
          description: input.description ?? null,
          area: input.area ?? null,
          application: input.application ?? 'other',
          speedRpm: input.speedRpm ?? null,
          ratedCurrentA: input.ratedCurrentA ?? null,
          efficiencyClass: input.efficiencyClass ?? 'unknown',
          nameplateEfficiencyPct: input.nameplateEfficiencyPct ?? null,
          powerFactor: input.powerFactor ?? null,
          frame: input.frame ?? null,
          enclosure: input.enclosure ?? null,
          manufacturer: input.manufacturer ?? null,
          yearInstalled: input.yearInstalled ?? null,
          controlMethod: input.controlMethod ?? 'direct-on-line',
          hoursPerYear: input.hoursPerYear ?? null,
          loadFactor: input.loadFactor ?? null,
          dutyProfile: input.dutyProfile ?? null,
          notes: input.notes ?? null,
        },
        transaction,
      );
      await tenant.audit('create', 'motor', created.id, input as Record<string, unknown>, transaction);
      return created.id;
    });
    return await getMotor(tenant, id);
  } catch (error) {
    if (error instanceof UniqueConstraintError) throw duplicateTag(input.tag);
    throw error;
  }
}

/** `{ field: { from, to } }` for the fields an edit changes. */
function changesOf(motor: Motor, fields: Record<string, unknown>): Record<string, { from: unknown; to: unknown }> {
  const changes: Record<string, { from: unknown; to: unknown }> = {};
  for (const [field, to] of Object.entries(fields)) {
    const from = (motor.get(field as keyof Motor) as unknown) ?? null;
    if (JSON.stringify(from) !== JSON.stringify(to)) changes[field] = { from, to };
  }
  return changes;
}

export async function updateMotor(tenant: Tenant, id: number, input: MotorUpdate): Promise<MotorOutput> {
  const { version, ...rest } = input;
  const fields = Object.fromEntries(Object.entries(rest).filter(([, value]) => value !== undefined));
  try {
    await database().transaction(async (transaction) => {
      const motor = await tenant.findById(Motor, id, 'Motor', { transaction });
      if (fields.siteId !== undefined) await requireSite(tenant, fields.siteId as number, transaction);
      const changes = changesOf(motor, fields);
      const [updated] = await Motor.update({ ...fields, version: version + 1 } as Partial<Motor>, {
        where: tenant.where<Motor>({ id, version }),
        transaction,
      });
      if (updated === 0) throw staleVersion('This motor');
      const action = changes.status ? (changes.status.to === 'retired' ? 'retire' : changes.status.from === 'retired' ? 'restore' : 'update') : 'update';
      await tenant.audit(action, 'motor', id, changes, transaction);
    });
  } catch (error) {
    if (error instanceof UniqueConstraintError) throw duplicateTag(String(fields.tag ?? ''));
    throw error;
  }
  return getMotor(tenant, id);
}

/** Retires a motor (see the module comment); with `version`, only if nobody changed it since. */
export async function retireMotor(tenant: Tenant, id: number, version: number | undefined): Promise<MotorOutput> {
  await database().transaction(async (transaction) => {
    const motor = await tenant.findById(Motor, id, 'Motor', { transaction });
    if (motor.status === 'retired') return;
    const expected = version ?? motor.version;
    const [updated] = await Motor.update({ status: 'retired', version: expected + 1 }, { where: tenant.where<Motor>({ id, version: expected }), transaction });
    if (updated === 0) throw staleVersion('This motor');
    await tenant.audit('retire', 'motor', id, { status: { from: motor.status, to: 'retired' } }, transaction);
  });
  return getMotor(tenant, id);
}

export async function motorHistory(tenant: Tenant, id: number, query: z.infer<typeof motorHistoryQuery>): Promise<ListResult<MotorHistoryItem>> {
  await tenant.findById(Motor, id, 'Motor');
  const { rows, count } = await AuditLog.findAndCountAll({
    where: { organizationId: tenant.organizationId, entity: 'motor', entityId: id },
    order: [['createdAt', 'DESC'], ['id', 'DESC']],
    ...pageWindow(query.page, query.pageSize),
  });
  const userIds = [...new Set(rows.map((row) => row.userId).filter((userId): userId is number => userId !== null))];
  const users = userIds.length > 0 ? await User.findAll({ where: { id: { [Op.in]: userIds }, organizationId: tenant.organizationId }, attributes: ['id', 'name'] }) : [];
  const names = new Map(users.map((user) => [user.id, user.name]));
  return {
    items: rows.map((row) => ({
      id: row.id,
      action: row.action,
      userId: row.userId,
      userName: row.userId === null ? null : (names.get(row.userId) ?? null),
      changes: row.changes,
      createdAt: row.createdAt.toISOString(),
    })),
    total: count,
    page: query.page,
    pageSize: query.pageSize,
  };
}

function toMeasurementOutput(measurement: MotorMeasurement): MeasurementOutput {
  return {
    id: measurement.id,
    motorId: measurement.motorId,
    measuredAt: measurement.measuredAt.toISOString(),
    inputPowerKw: measurement.inputPowerKw,
    speedRpm: measurement.speedRpm,
    currentA: measurement.currentA,
    voltageV: measurement.voltageV,
    note: measurement.note,
    userId: measurement.userId,
    createdAt: measurement.createdAt.toISOString(),
  };
}

export async function addMeasurement(tenant: Tenant, motorId: number, input: MeasurementCreate): Promise<MeasurementOutput> {
  const measurement = await database().transaction(async (transaction) => {
    await tenant.findById(Motor, motorId, 'Motor', { transaction });
    const created = await tenant.create(
      MotorMeasurement,
      {
        motorId,
        measuredAt: new Date(input.measuredAt),
        inputPowerKw: input.inputPowerKw ?? null,
        speedRpm: input.speedRpm ?? null,
        currentA: input.currentA ?? null,
        voltageV: input.voltageV ?? null,
        note: input.note ?? null,
        userId: tenant.user.id,
      },
      transaction,
    );
    await tenant.audit('add-measurement', 'motor', motorId, { measurementId: created.id, ...input }, transaction);
    return created;
  });
  return toMeasurementOutput(measurement);
}

export async function listMeasurements(tenant: Tenant, motorId: number): Promise<{ items: MeasurementOutput[] }> {
  await tenant.findById(Motor, motorId, 'Motor');
  const rows = await tenant.findAll(MotorMeasurement, { where: { motorId }, order: [['measuredAt', 'DESC'], ['id', 'DESC']], limit: 1000 });
  return { items: rows.map(toMeasurementOutput) };
}

