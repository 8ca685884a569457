/**
 * Motors (`/api/motors`): the register's zod schemas, shared by the server (validation, OpenAPI)
 * and the client (forms, types). The field rules agree with calc's `motorSchema`
 * (calc/assess/schema.ts): the enums, poles, frequency and duty-profile rules are calc's own schemas,
 * and every range is calc's range or a narrower one, so any motor the register accepts can be assessed.
 */
import { z } from 'zod';
import {
  applicationSchema,
  controlMethodSchema,
  dutyBinSchema,
  efficiencyClassSchema,
  frequencySchema,
  polesSchema,
} from '../../calc/assess/schema.js';
import { MAX_HOURS_PER_YEAR } from '../../calc/assess/defaults.js';
import { listOf, listQuery, versionField } from './common.js';

export { applicationSchema, controlMethodSchema, dutyBinSchema, efficiencyClassSchema, frequencySchema, polesSchema };

export const APPLICATIONS = applicationSchema.options;
export const CONTROL_METHODS = controlMethodSchema.options;
export const EFFICIENCY_CLASSES = efficiencyClassSchema.options;
export const MOTOR_STATUSES = ['in-service', 'standby', 'out-of-service', 'retired'] as const;
export const motorStatusSchema = z.enum(MOTOR_STATUSES, { error: `must be one of ${MOTOR_STATUSES.join(', ')}` });

/** Limits of the register, quoted by the messages (calc's limits or narrower). */
export const MOTOR_LIMITS = {
  minRatedPowerKw: 0.12,
  maxRatedPowerKw: 1000,
  maxSpeedRpm: 4000,
  minVoltageV: 100,
  maxVoltageV: 15000,
  maxCurrentA: 5000,
  maxNameplateEfficiencyPct: 99.9,
  maxHoursPerYear: MAX_HOURS_PER_YEAR,
  maxLoadFactor: 1.25,
  maxRewinds: 10,
  minYear: 1900,
  maxYear: 2200,
} as const;

const text = (max: number) => z.string().trim().max(max, `must be at most ${max} characters`);
const range = (min: number, max: number, unit: string, exclusiveMin = false) => {
  const base = z.number({ error: 'must be a number' });
  const lower = exclusiveMin ? base.positive('must be positive') : base.min(min, `must be at least ${min}${unit}`);
  return lower.max(max, `must be at most ${max}${unit}`);
};
const wholeRange = (min: number, max: number, tooLow: string, tooHigh: string) =>
  z.number({ error: 'must be a number' }).int('must be a whole number').min(min, tooLow).max(max, tooHigh);

/** A duty profile: bins of load (or flow) fraction and hours; the hours add up to a year or less. */
export const dutyProfileSchema = z
  .array(dutyBinSchema)
  .min(1, 'needs at least one bin')
  .max(48, 'has at most 48 bins')
  .refine((bins) => bins.reduce((sum, bin) => sum + bin.hours, 0) <= MAX_HOURS_PER_YEAR, {
    message: `hours must add up to ${MAX_HOURS_PER_YEAR} or less`,
  });

/**
 * Every editable field of a motor, with the rule of each. Required: tag, ratedPowerKw, poles,
 * voltageV, frequencyHz. The others may be left out or sent as null (= not known).
 */
export const motorFieldRules = {
  tag: z.string({ error: 'is required' }).trim().min(1, 'is required').max(60, 'must be at most 60 characters'),
  description: text(200),
  area: text(80),
  application: applicationSchema,
  ratedPowerKw: z
    .number({ error: 'must be a number' })
    .min(MOTOR_LIMITS.minRatedPowerKw, `must be between ${MOTOR_LIMITS.minRatedPowerKw} and ${MOTOR_LIMITS.maxRatedPowerKw} kW`)
    .max(MOTOR_LIMITS.maxRatedPowerKw, `must be between ${MOTOR_LIMITS.minRatedPowerKw} and ${MOTOR_LIMITS.maxRatedPowerKw} kW`),
  speedRpm: range(0, MOTOR_LIMITS.maxSpeedRpm, ' rpm', true),
  poles: polesSchema,
  voltageV: range(MOTOR_LIMITS.minVoltageV, MOTOR_LIMITS.maxVoltageV, ' V'),
  frequencyHz: frequencySchema,
  ratedCurrentA: range(0, MOTOR_LIMITS.maxCurrentA, ' A', true),
  efficiencyClass: efficiencyClassSchema,
  nameplateEfficiencyPct: range(0, MOTOR_LIMITS.maxNameplateEfficiencyPct, ' %', true),
  powerFactor: range(0, 1, '', true),
  frame: text(20),
  enclosure: text(20),
  manufacturer: text(80),
  yearInstalled: wholeRange(MOTOR_LIMITS.minYear, MOTOR_LIMITS.maxYear, `must be ${MOTOR_LIMITS.minYear} or later`, `must be ${MOTOR_LIMITS.maxYear} or earlier`),
  rewinds: wholeRange(0, MOTOR_LIMITS.maxRewinds, 'must be zero or more', `must be at most ${MOTOR_LIMITS.maxRewinds}`),
  controlMethod: controlMethodSchema,
  hoursPerYear: range(0, MOTOR_LIMITS.maxHoursPerYear, ' h (one year)'),
  loadFactor: range(0, MOTOR_LIMITS.maxLoadFactor, ''),
  dutyProfile: dutyProfileSchema,
  status: motorStatusSchema,
  notes: text(4000),
} as const;

export type MotorField = keyof typeof motorFieldRules;
export const MOTOR_FIELDS = Object.keys(motorFieldRules) as MotorField[];
export const REQUIRED_MOTOR_FIELDS = ['tag', 'ratedPowerKw', 'poles', 'voltageV', 'frequencyHz'] as const satisfies readonly MotorField[];

const r = motorFieldRules;
const maybe = <T extends z.ZodType>(schema: T) => schema.nullable().optional();

/** The fields of a motor as the API takes them (create; an update takes any subset plus `version`). */
const motorInputShape = {
  tag: r.tag,
  description: maybe(r.description),
  area: maybe(r.area),
  application: r.application.optional(),
  ratedPowerKw: r.ratedPowerKw,
  speedRpm: maybe(r.speedRpm),
  poles: r.poles,
  voltageV: r.voltageV,
  frequencyHz: r.frequencyHz,
  ratedCurrentA: maybe(r.ratedCurrentA),
  efficiencyClass: r.efficiencyClass.optional(),
  nameplateEfficiencyPct: maybe(r.nameplateEfficiencyPct),
  powerFactor: maybe(r.powerFactor),
  frame: maybe(r.frame),
  enclosure: maybe(r.enclosure),
  manufacturer: maybe(r.manufacturer),
  yearInstalled: maybe(r.yearInstalled),
  rewinds: r.rewinds.optional(),
  controlMethod: r.controlMethod.optional(),
  hoursPerYear: maybe(r.hoursPerYear),
  loadFactor: maybe(r.loadFactor),
  dutyProfile: maybe(r.dutyProfile),
  status: r.status.optional(),
  notes: maybe(r.notes),
};

/** `POST /api/motors`. Left-out fields take: application other, efficiencyClass unknown, rewinds 0, controlMethod direct-on-line, status in-service. */
export const motorCreateBody = z.object({ siteId: z.number().int().positive(), ...motorInputShape });
export type MotorCreate = z.infer<typeof motorCreateBody>;

/** `PATCH /api/motors/:id`: any subset of the fields (siteId moves the motor) and the version loaded. */
export const motorUpdateBody = z
  .object({ siteId: z.number().int().positive(), ...motorInputShape })
  .partial()
  .extend({ version: versionField });
export type MotorUpdate = z.infer<typeof motorUpdateBody>;

export const motorOutput = z.object({
  id: z.number().int(),
  siteId: z.number().int(),
  siteName: z.string(),
  tag: z.string(),
  description: z.string().nullable(),
  area: z.string().nullable(),
  application: applicationSchema,
  ratedPowerKw: z.number(),
  speedRpm: z.number().nullable(),
  poles: z.number().int(),
  voltageV: z.number(),
  frequencyHz: z.number().int(),
  ratedCurrentA: z.number().nullable(),
  efficiencyClass: efficiencyClassSchema,
  nameplateEfficiencyPct: z.number().nullable(),
  powerFactor: z.number().nullable(),
  frame: z.string().nullable(),
  enclosure: z.string().nullable(),
  manufacturer: z.string().nullable(),
  yearInstalled: z.number().int().nullable(),
  rewinds: z.number().int(),
  controlMethod: controlMethodSchema,
  hoursPerYear: z.number().nullable(),
  loadFactor: z.number().nullable(),
  dutyProfile: z.array(dutyBinSchema).nullable(),
  status: motorStatusSchema,
  notes: z.string().nullable(),
  importBatchId: z.number().int().nullable(),
  version: z.number().int(),
  createdAt: z.string(),
  updatedAt: z.string(),
});
export type MotorOutput = z.infer<typeof motorOutput>;

export const MOTOR_SORT_FIELDS = [
  'tag',
  'description',
  'area',
  'application',
  'ratedPowerKw',
  'speedRpm',
  'poles',
  'voltageV',
  'efficiencyClass',
  'nameplateEfficiencyPct',
  'controlMethod',
  'hoursPerYear',
  'yearInstalled',
  'manufacturer',
  'status',
  'updatedAt',
] as const;

/** A filter that takes one value, a comma-separated list, or the parameter repeated (`?application=fan&application=pump`). */
function oneOrMany<T extends z.ZodType>(item: T) {
  return z.preprocess((value) => {
    if (value === undefined || value === '') return undefined;
    const list = Array.isArray(value) ? value : [value];
    return list.flatMap((entry) => String(entry).split(',')).map((entry) => entry.trim()).filter((entry) => entry !== '');
  }, z.array(item).max(20).optional());
}

/**
 * The register's filters, shared by the list and the export. `status` left out means every status
 * but `retired` (a retired motor stays in the database with its history; ask `status=retired` to see it).
 */
export const motorFilterShape = {
  q: z.string().trim().max(100).optional(),
  siteId: oneOrMany(z.coerce.number().int().positive()),
  area: z.string().trim().max(80).optional(),
  application: oneOrMany(applicationSchema),
  efficiencyClass: oneOrMany(efficiencyClassSchema),
  controlMethod: oneOrMany(controlMethodSchema),
  status: oneOrMany(motorStatusSchema),
  minKw: z.coerce.number().min(0).optional(),
  maxKw: z.coerce.number().min(0).optional(),
};

/** `GET /api/motors` → `{ items, total, page, pageSize }` of motorOutput. */
export const motorListQuery = listQuery(MOTOR_SORT_FIELDS, 'tag').extend(motorFilterShape);
export type MotorListQuery = z.infer<typeof motorListQuery>;
export const motorList = listOf(motorOutput);

/** `GET /api/motors/export`: the same filters and sort, no paging; answers an .xlsx file. */
export const motorExportQuery = motorListQuery.omit({ page: true, pageSize: true });
export type MotorExportQuery = z.infer<typeof motorExportQuery>;
export const MOTOR_EXPORT_MAX_ROWS = 200_000;

/** `DELETE /api/motors/:id?version=N`: retires the motor (status `retired`); history and files stay. */
export const motorDeleteQuery = z.object({ version: z.coerce.number().int().min(0).optional() });

/** One entry of `GET /api/motors/:id/history`, newest first. */
export const motorHistoryItem = z.object({
  id: z.number().int(),
  action: z.string(),
  userId: z.number().int().nullable(),
  userName: z.string().nullable(),
  changes: z.record(z.string(), z.unknown()).nullable(),
  createdAt: z.string(),
});
export type MotorHistoryItem = z.infer<typeof motorHistoryItem>;
export const motorHistoryQuery = z.object({
  page: z.coerce.number().int().min(1).default(1),
  pageSize: z.coerce.number().int().min(1).max(200).default(50),
});
export const motorHistoryList = listOf(motorHistoryItem);

/** Field measurements for load estimation. At least one reading besides the date. */
export const measurementCreateBody = z
  .object({
    measuredAt: z.iso.datetime({ offset: true, error: 'must be a date and time (ISO 8601)' }).or(z.iso.date({ error: 'must be a date (YYYY-MM-DD)' })),
    inputPowerKw: range(0, 2 * MOTOR_LIMITS.maxRatedPowerKw, ' kW', true).optional(),
    speedRpm: range(0, MOTOR_LIMITS.maxSpeedRpm, ' rpm', true).optional(),
    currentA: range(0, MOTOR_LIMITS.maxCurrentA, ' A', true).optional(),
    voltageV: range(MOTOR_LIMITS.minVoltageV, MOTOR_LIMITS.maxVoltageV, ' V').optional(),
    note: text(500).optional(),
  })
  .refine((m) => m.inputPowerKw !== undefined || m.speedRpm !== undefined || m.currentA !== undefined, {
    message: 'give at least one of inputPowerKw, speedRpm, currentA',
    path: ['inputPowerKw'],
  });
export type MeasurementCreate = z.infer<typeof measurementCreateBody>;

export const measurementOutput = z.object({
  id: z.number().int(),
  motorId: z.number().int(),
  measuredAt: z.string(),
  inputPowerKw: z.number().nullable(),
  speedRpm: z.number().nullable(),
  currentA: z.number().nullable(),
  voltageV: z.number().nullable(),
  note: z.string().nullable(),
  userId: z.number().int().nullable(),
  createdAt: z.string(),
});
export type MeasurementOutput = z.infer<typeof measurementOutput>;
export const measurementList = z.object({ items: z.array(measurementOutput) });

/** Uploaded files of a motor. Images (JPEG, PNG, WebP) and PDF only, recognised from their content. */
export const MOTOR_FILE_KINDS = ['nameplate-photo', 'document'] as const;
export const motorFileKindSchema = z.enum(MOTOR_FILE_KINDS, { error: `must be one of ${MOTOR_FILE_KINDS.join(', ')}` });
export const MOTOR_FILE_MAX_BYTES = 10 * 1024 * 1024;
export const MOTOR_FILE_TYPES = ['image/jpeg', 'image/png', 'image/webp', 'application/pdf'] as const;
/** Multipart fields besides `file` of `POST /api/motors/:id/files`. */
export const motorFileUploadBody = z.object({ kind: motorFileKindSchema.default('document') });

export const motorFileOutput = z.object({
  id: z.number().int(),
  motorId: z.number().int(),
  kind: motorFileKindSchema,
  fileName: z.string(),
  contentType: z.enum(MOTOR_FILE_TYPES),
  sizeBytes: z.number().int(),
  userId: z.number().int().nullable(),
  createdAt: z.string(),
});
export type MotorFileOutput = z.infer<typeof motorFileOutput>;
export const motorFileList = z.object({ items: z.array(motorFileOutput) });
export const motorFileParams = z.object({ id: z.coerce.number().int().positive(), fileId: z.coerce.number().int().positive() });
