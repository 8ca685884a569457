/**
 * Intake (`/api/imports`): spreadsheet imports of a motor list. Shared by the server and the client.
 *
 * Flow: `POST /api/imports` (multipart `file`, `siteId`, optional `mapping`) parses and validates
 * every row and stores the batch as a preview → `PUT /api/imports/:id/mapping` re-maps and
 * re-validates → `POST /api/imports/:id/commit` writes every valid row in one transaction (rows with
 * errors are skipped and stay listed in the batch; a commit with no valid row is refused) →
 * `DELETE /api/imports/:id` undoes a committed batch (or discards a preview).
 */
import { z } from 'zod';
import { listOf, listQuery } from './common.js';
import { MOTOR_FIELDS, type MotorField } from './motor.js';

/** Fields a column can map to: every motor field. */
export const IMPORT_FIELDS = MOTOR_FIELDS;
export type ImportField = MotorField;
export const importFieldSchema = z.enum(MOTOR_FIELDS as [MotorField, ...MotorField[]], { error: 'is not a motor field' });

/** What a column holds, for the template, header suggestions and cell parsing. */
export interface ImportFieldInfo {
  field: ImportField;
  /** Header of the template's column (the unit in brackets is read back as the column's unit). */
  label: string;
  /** Unit of a bare number, or '' for text, codes and plain numbers. */
  unit: string;
  /** Units a cell or a header may use instead. */
  otherUnits: string[];
  required: boolean;
  /** What the template's help row says. */
  help: string;
  example: string | number;
}

export const IMPORT_FIELD_INFO: readonly ImportFieldInfo[] = [
  { field: 'tag', label: 'Tag', unit: '', otherUnits: [], required: true, help: 'unique within the site; re-importing a tag updates that motor', example: 'P-101' },
  { field: 'description', label: 'Description', unit: '', otherUnits: [], required: false, help: 'free text', example: 'Raw water pump 1' },
  { field: 'area', label: 'Area', unit: '', otherUnits: [], required: false, help: 'area or line', example: 'Intake' },
  { field: 'application', label: 'Application', unit: '', otherUnits: [], required: false, help: 'fan, pump, compressor, conveyor, mixer or other (default other)', example: 'pump' },
  { field: 'ratedPowerKw', label: 'Rated power (kW)', unit: 'kW', otherUnits: ['W', 'hp'], required: true, help: '0.12–1000 kW; "10 hp" or "7,5 kW" accepted', example: 7.5 },
  { field: 'speedRpm', label: 'Speed (rpm)', unit: 'rpm', otherUnits: [], required: false, help: 'rated speed', example: 1460 },
  { field: 'poles', label: 'Poles', unit: '', otherUnits: [], required: true, help: '2, 4, 6 or 8; worked out from speed and frequency when blank', example: 4 },
  { field: 'voltageV', label: 'Voltage (V)', unit: 'V', otherUnits: ['kV'], required: true, help: 'line-to-line; the site’s voltage when blank', example: 400 },
  { field: 'frequencyHz', label: 'Frequency (Hz)', unit: 'Hz', otherUnits: [], required: true, help: '50 or 60; the site’s frequency when blank', example: 50 },
  { field: 'ratedCurrentA', label: 'Rated current (A)', unit: 'A', otherUnits: [], required: false, help: 'nameplate full-load current', example: 14.2 },
  { field: 'efficiencyClass', label: 'Efficiency class', unit: '', otherUnits: [], required: false, help: 'IE1–IE5 or unknown (default unknown)', example: 'IE3' },
  { field: 'nameplateEfficiencyPct', label: 'Nameplate efficiency (%)', unit: '%', otherUnits: [], required: false, help: 'full-load efficiency; 0.912 is read as 91.2 %', example: 91.2 },
  { field: 'powerFactor', label: 'Power factor', unit: '', otherUnits: ['%'], required: false, help: 'cos φ at full load, 0–1', example: 0.82 },
  { field: 'frame', label: 'Frame', unit: '', otherUnits: [], required: false, help: 'IEC or NEMA frame', example: '132M' },
  { field: 'enclosure', label: 'Enclosure', unit: '', otherUnits: [], required: false, help: 'e.g. TEFC, IP55', example: 'IP55' },
  { field: 'manufacturer', label: 'Manufacturer', unit: '', otherUnits: [], required: false, help: 'free text', example: 'Example Motors' },
  { field: 'yearInstalled', label: 'Year installed', unit: '', otherUnits: [], required: false, help: 'four digits', example: 2008 },
  { field: 'rewinds', label: 'Rewinds', unit: '', otherUnits: [], required: false, help: 'number of rewinds (default 0)', example: 1 },
  { field: 'controlMethod', label: 'Control method', unit: '', otherUnits: [], required: false, help: 'DOL, throttling valve, outlet damper, inlet vanes, VSD (default DOL)', example: 'DOL' },
  { field: 'hoursPerYear', label: 'Hours per year (h/yr)', unit: 'h/yr', otherUnits: ['h/week', 'h/day'], required: false, help: '0–8760', example: 6000 },
  { field: 'loadFactor', label: 'Load factor', unit: '', otherUnits: ['%'], required: false, help: 'average load / rated, 0–1.25; "75 %" accepted', example: 0.75 },
  { field: 'dutyProfile', label: 'Duty profile', unit: '', otherUnits: [], required: false, help: 'bins as fraction:hours separated by ; e.g. 0.5:2000; 0.8:3000', example: '0.5:2000; 0.8:3000' },
  { field: 'status', label: 'Status', unit: '', otherUnits: [], required: false, help: 'in service, standby, out of service, retired (default in service)', example: 'in service' },
  { field: 'notes', label: 'Notes', unit: '', otherUnits: [], required: false, help: 'free text', example: '' },
];

/**
 * Column mapping: spreadsheet header → motor field, or null to ignore the column. Headers are as
 * returned in `headers` (blank headers become "Column C", repeated ones "Rated power (2)").
 */
export const importMapping = z.record(z.string().max(200), importFieldSchema.nullable());
export type ImportMapping = z.infer<typeof importMapping>;

/** Multipart fields besides `file` of `POST /api/imports`; `mapping` is a JSON string. */
export const importUploadBody = z.object({
  siteId: z.coerce.number().int().positive(),
  mapping: z
    .string()
    .max(100_000)
    .optional()
    .transform((value, context) => {
      if (value === undefined || value.trim() === '') return undefined;
      try {
        const parsed = importMapping.safeParse(JSON.parse(value));
        if (parsed.success) return parsed.data;
        context.addIssue({ code: 'custom', message: `must map headers to motor fields (${parsed.error.issues[0]?.message ?? 'invalid'})` });
      } catch {
        context.addIssue({ code: 'custom', message: 'must be JSON: { "header": "field" }' });
      }
      return z.NEVER;
    }),
});

export const IMPORT_LIMITS = {
  /** Upload size [bytes]. */
  maxFileBytes: 25 * 1024 * 1024,
  /** Data rows below the header row. */
  maxRows: 100_000,
  maxColumns: 200,
  /** Wall-clock limit of the parsing worker [ms]. */
  parseTimeoutMs: 90_000,
  /** Heap limit of the parsing worker [MB]. */
  parseHeapMb: 1024,
  /** Row issues listed in the upload/re-map answer (all are in the paged preview). */
  maxIssuesListed: 500,
} as const;

export const IMPORT_STATUSES = ['parsing', 'previewed', 'committing', 'committed', 'failed', 'undone'] as const;
export const importStatusSchema = z.enum(IMPORT_STATUSES);

/** One problem of one cell. `row` is the spreadsheet row number the user sees (1-based). */
export const rowIssue = z.object({
  row: z.number().int(),
  field: z.string(),
  value: z.string().nullable(),
  message: z.string(),
});
export type RowIssue = z.infer<typeof rowIssue>;

export const duplicateInFile = z.object({ tag: z.string(), rows: z.array(z.number().int()) });
export const duplicateInRegister = z.object({ tag: z.string(), row: z.number().int(), motorId: z.number().int() });

/** Counts and status of a batch: the items of `GET /api/imports` and the head of every batch answer. */
export const importBatchSummary = z.object({
  id: z.number().int(),
  siteId: z.number().int(),
  siteName: z.string(),
  fileName: z.string(),
  fileSizeBytes: z.number().int(),
  status: importStatusSchema,
  /** 0–1 while committing or undoing; 1 when done. */
  progress: z.number(),
  userId: z.number().int().nullable(),
  userName: z.string().nullable(),
  rows: z.object({ total: z.number().int(), valid: z.number().int(), invalid: z.number().int(), warnings: z.number().int() }),
  createdCount: z.number().int(),
  updatedCount: z.number().int(),
  /** Why the last commit failed (status failed), else null. */
  failure: z.string().nullable(),
  createdAt: z.string(),
  committedAt: z.string().nullable(),
  undoneAt: z.string().nullable(),
});
export type ImportBatchSummary = z.infer<typeof importBatchSummary>;

/** Answer of `POST /api/imports` and `PUT /api/imports/:id/mapping`. */
export const importPreviewResult = importBatchSummary.extend({
  headers: z.array(z.string()),
  /** Spreadsheet row number of the header row (title rows above it are skipped). */
  headerRow: z.number().int(),
  sheetName: z.string(),
  mapping: importMapping,
  /** Required fields no column maps to and that cannot be defaulted. */
  unmappedRequired: z.array(z.string()),
  /** The first IMPORT_LIMITS.maxIssuesListed errors and warnings; the preview has them all. */
  errors: z.array(rowIssue),
  warnings: z.array(rowIssue),
  duplicates: z.object({ inFile: z.array(duplicateInFile), inRegister: z.array(duplicateInRegister) }),
});
export type ImportPreviewResult = z.infer<typeof importPreviewResult>;

/** `GET /api/imports/:id?filter=invalid&page=2`: the batch with a page of its rows. */
export const importDetailQuery = z.object({
  filter: z.enum(['all', 'valid', 'invalid', 'warning']).default('all'),
  page: z.coerce.number().int().min(1).default(1),
  pageSize: z.coerce.number().int().min(1).max(500).default(50),
});

export const importRowOutput = z.object({
  row: z.number().int(),
  /** What the commit does (did) with the row: create, update, or skip (invalid). */
  action: z.enum(['create', 'update', 'skip']),
  motorId: z.number().int().nullable(),
  /** The parsed values, in the motor vocabulary (units converted). */
  values: z.record(z.string(), z.unknown()),
  /** The raw cells by header. */
  cells: z.record(z.string(), z.union([z.string(), z.number(), z.null()])),
  errors: z.array(rowIssue),
  warnings: z.array(rowIssue),
});
export type ImportRowOutput = z.infer<typeof importRowOutput>;

export const importDetail = importPreviewResult.extend({ preview: listOf(importRowOutput) });
export type ImportDetail = z.infer<typeof importDetail>;

export const IMPORT_SORT_FIELDS = ['createdAt', 'fileName', 'status'] as const;
export const importListQuery = listQuery(IMPORT_SORT_FIELDS, '-createdAt').extend({
  siteId: z.coerce.number().int().positive().optional(),
  status: importStatusSchema.optional(),
});
export const importList = listOf(importBatchSummary);

export const importMappingBody = z.object({ mapping: importMapping });

export const importCommitResult = z.object({ created: z.number().int(), updated: z.number().int(), skipped: z.number().int() });
export type ImportCommitResult = z.infer<typeof importCommitResult>;

export const importUndoResult = z.object({ removed: z.number().int(), restored: z.number().int(), status: importStatusSchema });
