/**
 * The Retrofit log (issue 9): a retrofit's workflow from proposal to verified savings, its data
 * (dates, actual capex, rebate, the installed equipment), documents and photos, meter data of a
 * baseline and a reporting period, and the verified savings in the manner of IPMVP options A and B.
 *
 * The list item extends the screening's `retrofitOutput` (server/shared/screening.ts), so
 * `GET /api/retrofits` keeps the fields it has always answered.
 */
import { z } from 'zod';
import { OPTION_CODES } from '../../calc/assess/options.js';
import type { Role } from './roles.js';
import { listOf } from './common.js';
import { RETROFIT_STATUSES, retrofitListQuery, retrofitOutput } from './screening.js';

export { RETROFIT_STATUSES };
export type RetrofitStatus = (typeof RETROFIT_STATUSES)[number];

/** The workflow: which status may follow which. Rejected and verified are final. */
export const RETROFIT_TRANSITIONS: Readonly<Record<RetrofitStatus, readonly RetrofitStatus[]>> = {
  proposed: ['approved', 'rejected'],
  approved: ['ordered', 'rejected'],
  ordered: ['installed'],
  installed: ['verified'],
  verified: [],
  rejected: [],
};

/**
 * Who may move a retrofit INTO a status. Approvers alone decide (approve or reject), as for business
 * cases: an admin who must decide gives themselves the approver role, which the audit log records,
 * so that the person who proposes and the person who approves stay apart. Engineers and admins do
 * the field work (order, installation, verification).
 */
export const TRANSITION_ROLES: Readonly<Record<RetrofitStatus, readonly Role[]>> = {
  proposed: ['engineer', 'admin'],
  approved: ['approver'],
  rejected: ['approver'],
  ordered: ['engineer', 'admin'],
  installed: ['engineer', 'admin'],
  verified: ['engineer', 'admin'],
};

/** The statuses `role` may move a retrofit in `status` to. */
export function allowedTransitions(status: RetrofitStatus, role: Role): RetrofitStatus[] {
  return RETROFIT_TRANSITIONS[status].filter((next) => TRANSITION_ROLES[next].includes(role));
}

/** A proposal waiting longer than this for a decision is flagged overdue [days]. */
export const PROPOSAL_DECISION_DAYS = 30;

export const RETROFIT_OPTION_CODES = OPTION_CODES.filter((code) => code !== 'keep') as [string, ...string[]];

const isoDate = z.string().regex(/^\d{4}-\d{2}-\d{2}$/, 'must be a date YYYY-MM-DD');
const money = z.number().min(0, 'must be zero or more').max(1e10, 'must be at most 10 000 000 000');
const text = (max: number) => z.string().trim().max(max, `must be at most ${max} characters`);

/** The installed motor's and drive's data (what was actually fitted, from its nameplate), and who fitted it. */
export const installedEquipment = z.object({
  /** The electrician or contractor who did the work (the person who records it is in the history). */
  installedBy: text(120).optional(),
  motor: z
    .object({
      type: text(80).optional(),
      ratedPowerKw: z.number().positive('must be positive').max(100_000).optional(),
      efficiencyPct: z.number().gt(0, 'must be above 0 %').max(100, 'must be at most 100 %').optional(),
      efficiencyClass: text(10).optional(),
      frame: text(40).optional(),
    })
    .optional(),
  drive: z
    .object({
      type: text(80).optional(),
      ratedPowerKw: z.number().positive('must be positive').max(100_000).optional(),
      efficiencyPct: z.number().gt(0, 'must be above 0 %').max(100, 'must be at most 100 %').optional(),
    })
    .optional(),
});
export type InstalledEquipment = z.infer<typeof installedEquipment>;

/** `POST /api/retrofits`: an engineer's proposal for one motor. */
export const retrofitCreateBody = z.object({
  motorId: z.number().int().positive(),
  optionCode: z.enum(RETROFIT_OPTION_CODES, { error: 'must be a retrofit option code such as ie4 or bldc-vsd' }),
  /** Predicted savings from the engineer's study [kWh/yr]; a business case replaces them on approval. */
  predictedSavingsKwh: z.number().min(0, 'must be zero or more').max(1e9).default(0),
  predictedSavingsCost: money.default(0),
  capex: money.default(0),
  comment: text(2000).optional(),
  notes: text(5000).optional(),
});
export type RetrofitCreate = z.infer<typeof retrofitCreateBody>;

export const VERIFICATION_METHODS = ['A', 'B'] as const;

/** `PATCH /api/retrofits/:id`: a transition (status + comment) and/or data fields, with the version read. */
export const retrofitPatchBody = z
  .object({
    version: z.number().int().min(0),
    status: z.enum(RETROFIT_STATUSES, { error: `must be one of ${RETROFIT_STATUSES.join(', ')}` }).optional(),
    comment: text(2000).optional(),
    orderDate: isoDate.nullable().optional(),
    expectedInstallationDate: isoDate.nullable().optional(),
    installationDate: isoDate.nullable().optional(),
    actualCapex: money.nullable().optional(),
    rebateReceived: money.nullable().optional(),
    installedEquipment: installedEquipment.nullable().optional(),
    notes: text(5000).nullable().optional(),
    verificationMethod: z.enum(VERIFICATION_METHODS, { error: 'must be A or B' }).optional(),
    /** A column of the meter files to adjust the baseline by; null: operating hours from the metered power. */
    independentVariable: text(80).min(1, 'must not be empty').nullable().optional(),
    /** Option A's stipulated operating hours [h/yr]; null: the motor register's hoursPerYear. */
    stipulatedHoursPerYear: z.number().positive('must be positive').max(8784, 'must be at most 8784 h').nullable().optional(),
  })
  .refine((body) => body.status !== 'rejected' || (body.comment ?? '').length > 0, { message: 'is required when rejecting', path: ['comment'] });
export type RetrofitPatch = z.infer<typeof retrofitPatchBody>;

/** The data fields of a PATCH (everything but version, status and comment). */
export const RETROFIT_DATA_FIELDS = [
  'orderDate',
  'expectedInstallationDate',
  'installationDate',
  'actualCapex',
  'rebateReceived',
  'installedEquipment',
  'notes',
  'verificationMethod',
  'independentVariable',
  'stipulatedHoursPerYear',
] as const;

/** `GET /api/retrofits`: the screening's list query plus the overdue filter. */
export const retrofitLogQuery = retrofitListQuery.extend({
  overdue: z.enum(['true', 'false']).optional(),
});
export type RetrofitLogQuery = z.infer<typeof retrofitLogQuery>;

export const retrofitLogItem = retrofitOutput.extend({
  source: z.string(),
  orderDate: z.string().nullable(),
  expectedInstallationDate: z.string().nullable(),
  installationDate: z.string().nullable(),
  actualCapex: z.number().nullable(),
  rebateReceived: z.number().nullable(),
  statusChangedAt: z.string().nullable(),
  overdue: z.boolean(),
  /** Why the item is overdue, for people ("installation was due on 2026-03-01"). */
  overdueReason: z.string().nullable(),
  verificationMethod: z.enum(VERIFICATION_METHODS),
  /** Frozen at the 'verified' transition [kWh/yr]. */
  verifiedSavingsKwh: z.number().nullable(),
  verifiedUncertaintyKwh: z.number().nullable(),
});
export type RetrofitLogItem = z.infer<typeof retrofitLogItem>;
export const retrofitLogList = listOf(retrofitLogItem);

export const retrofitEventOutput = z.object({
  id: z.number().int(),
  fromStatus: z.enum(RETROFIT_STATUSES).nullable(),
  toStatus: z.enum(RETROFIT_STATUSES),
  userId: z.number().int().nullable(),
  userName: z.string().nullable(),
  comment: z.string().nullable(),
  createdAt: z.string(),
});
export type RetrofitEventOutput = z.infer<typeof retrofitEventOutput>;

export const RETROFIT_FILE_KINDS = ['document', 'photo'] as const;
export type RetrofitFileKind = (typeof RETROFIT_FILE_KINDS)[number];
export const retrofitFileFields = z.object({ kind: z.enum(RETROFIT_FILE_KINDS, { error: 'must be document or photo' }).default('document') });
export const retrofitFileOutput = z.object({
  id: z.number().int(),
  retrofitId: z.number().int(),
  kind: z.enum(RETROFIT_FILE_KINDS),
  fileName: z.string(),
  contentType: z.string(),
  sizeBytes: z.number().int(),
  userId: z.number().int().nullable(),
  createdAt: z.string(),
});
export type RetrofitFileOutput = z.infer<typeof retrofitFileOutput>;
export const retrofitFileParams = z.object({ id: z.coerce.number().int().positive(), fileId: z.coerce.number().int().positive() });

// ---- Meter data ----------------------------------------------------------------------------------

export const METER_PERIODS = ['baseline', 'reporting'] as const;
export type MeterPeriod = (typeof METER_PERIODS)[number];
export const METER_UNITS = ['kW', 'kWh'] as const;
export type MeterUnit = (typeof METER_UNITS)[number];
/** 'interval': each row is the mean power or the energy of its interval; 'cumulative': an energy counter reading. */
export const METER_REGISTERS = ['interval', 'cumulative'] as const;
export type MeterRegister = (typeof METER_REGISTERS)[number];
/** 'motor': the meter measures the retrofitted motor alone; 'feeder': a feeder that also supplies other loads. */
export const METER_SCOPES = ['motor', 'feeder'] as const;
export type MeterScope = (typeof METER_SCOPES)[number];

/** Text fields of `POST /api/retrofits/:id/meter-data` (multipart, with the CSV in `file`). */
export const meterUploadFields = z.object({
  period: z.enum(METER_PERIODS, { error: 'must be baseline or reporting' }),
  unit: z.enum(METER_UNITS, { error: 'must be kW or kWh' }).optional(),
  register: z.enum(METER_REGISTERS, { error: 'must be interval or cumulative' }).default('interval'),
  scope: z.enum(METER_SCOPES, { error: 'must be motor or feeder' }).default('motor'),
});
export type MeterUploadFields = z.infer<typeof meterUploadFields>;

/** A row-level problem of a meter file; `row` is the line of the file (the header is row 1). */
export const meterRowError = z.object({ row: z.number().int(), field: z.string(), value: z.string(), message: z.string() });
export type MeterRowError = z.infer<typeof meterRowError>;

/** A span without data: longer than the typical interval; reported, never filled. Wall-clock ISO times. */
export const meterGap = z.object({ start: z.string(), end: z.string(), hours: z.number(), afterRow: z.number().int() });
export type MeterGap = z.infer<typeof meterGap>;

/** One metered interval: [start, wall-clock ms since 1970; duration h; energy kWh; independent variable or null]. */
export type MeterPoint = [number, number, number, number | null];

export const meterUploadResult = z.object({
  period: z.enum(METER_PERIODS),
  /** Data rows accepted (all of them: a file with any row error is refused as a whole). */
  rows: z.number().int(),
  errors: z.array(meterRowError),
  gaps: z.array(meterGap),
  unit: z.enum(METER_UNITS),
  register: z.enum(METER_REGISTERS),
  scope: z.enum(METER_SCOPES),
  intervalMinutes: z.number(),
  variableName: z.string().nullable(),
  utcOffset: z.string().nullable(),
  start: z.string(),
  end: z.string(),
  totalKwh: z.number(),
});
export type MeterUploadResult = z.infer<typeof meterUploadResult>;

/** The stored data of one period, with a chart series of mean power (null at gaps, so lines break there). */
export const meterPeriodOutput = meterUploadResult.omit({ errors: true }).extend({
  fileName: z.string(),
  uploadedAt: z.string(),
  coveredHours: z.number(),
  series: z.array(z.tuple([z.number(), z.number().nullable()])),
});
export type MeterPeriodOutput = z.infer<typeof meterPeriodOutput>;
export const meterDataOutput = z.object({ baseline: meterPeriodOutput.nullable(), reporting: meterPeriodOutput.nullable() });
export type MeterDataOutput = z.infer<typeof meterDataOutput>;

// ---- Verification --------------------------------------------------------------------------------

export const periodStatistics = z.object({
  start: z.string(),
  end: z.string(),
  kwh: z.number(),
  coveredHours: z.number(),
  operatingHours: z.number(),
  meanRunningKw: z.number().nullable(),
  variableTotal: z.number().nullable(),
  scope: z.enum(METER_SCOPES),
  gaps: z.number().int(),
});
export type PeriodStatistics = z.infer<typeof periodStatistics>;

export const verificationOutput = z.object({
  retrofitId: z.number().int(),
  /** False until both periods have data (and option A its stipulated hours); `missing` says what. */
  ready: z.boolean(),
  missing: z.array(z.string()),
  method: z.enum(VERIFICATION_METHODS),
  /** 'regression' or 'ratio' (option B), 'stipulated-hours' (option A). */
  model: z.enum(['regression', 'ratio', 'stipulated-hours']).nullable(),
  /** The method in words and its formula, as a report prints them. */
  description: z.string().nullable(),
  formula: z.string().nullable(),
  independentVariable: z.string().nullable(),
  thresholdKw: z.number(),
  hoursPerYear: z.number().nullable(),
  baseline: periodStatistics.nullable(),
  reporting: periodStatistics.nullable(),
  /** Metered energy of each period [kWh]. */
  baselineKwh: z.number().nullable(),
  reportingKwh: z.number().nullable(),
  /** The baseline adjusted to the reporting period's conditions [kWh]. */
  adjustedBaselineKwh: z.number().nullable(),
  /** The reporting energy the savings are taken against: metered (B) or at stipulated hours (A) [kWh]. */
  reportingComparedKwh: z.number().nullable(),
  /** Savings over the reporting period = adjustedBaselineKwh − reportingComparedKwh [kWh]. */
  verifiedSavingsKwh: z.number().nullable(),
  /** The same, annualised [kWh/yr]. */
  annualSavingsKwh: z.number().nullable(),
  predictedSavingsKwh: z.number(),
  /** annualSavingsKwh / predictedSavingsKwh [%]. */
  realisedPct: z.number().nullable(),
  regression: z.object({ intercept: z.number(), slope: z.number(), r2: z.number(), cvRmsePct: z.number(), days: z.number().int() }).nullable(),
  /** ± of annualSavingsKwh at `confidencePct` [kWh/yr], and of verifiedSavingsKwh [kWh]. */
  uncertaintyKwh: z.number().nullable(),
  uncertaintyPeriodKwh: z.number().nullable(),
  confidencePct: z.number(),
  uncertaintyMethod: z.string().nullable(),
  notes: z.array(z.string()),
});
export type VerificationOutput = z.infer<typeof verificationOutput>;

export const verificationSummaryQuery = z.object({ siteId: z.coerce.number().int().positive().optional() });
const summaryFigures = z.object({
  retrofits: z.number().int(),
  /** Retrofits whose verification is ready. */
  verifiable: z.number().int(),
  predictedSavingsKwh: z.number(),
  /** Sum of annualSavingsKwh of the verifiable retrofits [kWh/yr]. */
  verifiedSavingsKwh: z.number(),
  /** Predicted savings of the same verifiable retrofits [kWh/yr]. */
  predictedOfVerifiedKwh: z.number(),
  realisedPct: z.number().nullable(),
  /** Root-sum-square of the retrofits' uncertainties (independent measurements) [kWh/yr]. */
  uncertaintyKwh: z.number().nullable(),
});
export const verificationSummary = z.object({
  sites: z.array(summaryFigures.extend({ siteId: z.number().int(), siteName: z.string() })),
  organization: summaryFigures,
});
export type VerificationSummary = z.infer<typeof verificationSummary>;

export const retrofitDetail = retrofitLogItem.extend({
  installedEquipment: installedEquipment.nullable(),
  notes: z.string().nullable(),
  independentVariable: z.string().nullable(),
  stipulatedHoursPerYear: z.number().nullable(),
  createdByName: z.string().nullable(),
  motor: z.object({
    id: z.number().int(),
    tag: z.string(),
    description: z.string().nullable(),
    ratedPowerKw: z.number(),
    efficiencyClass: z.string(),
    frame: z.string().nullable(),
    hoursPerYear: z.number().nullable(),
    application: z.string(),
  }),
  /** The statuses the signed-in user may move this retrofit to. */
  allowedTransitions: z.array(z.enum(RETROFIT_STATUSES)),
  events: z.array(retrofitEventOutput),
  files: z.array(retrofitFileOutput),
});
export type RetrofitDetail = z.infer<typeof retrofitDetail>;
