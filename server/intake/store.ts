/**
 * Bulk SQL of the Intake. Staging rows are written in chunks of multi-row statements fed by
 * `jsonb_to_recordset`, not row by row. The commit is set-based: a few statements that read the
 * batch's staged values straight from `import_rows` (`commitStatements`), so a 50,000-row commit
 * never ships its rows back and forth between Node and PostgreSQL.
 */
import { QueryTypes, type Transaction } from 'sequelize';
import { database } from '../lib/database.js';
import type { ValidatedRow } from './validate.js';

const CHUNK_ROWS = 2000;

/** Motor fields written by an import: field → [column, recordset type, cast]. */
const MOTOR_COLUMNS: ReadonlyArray<readonly [field: string, column: string, type: string, cast: string]> = [
  ['tag', 'tag', 'text', ''],
  ['description', 'description', 'text', ''],
  ['area', 'area', 'text', ''],
  ['application', 'application', 'text', '::"enum_motors_application"'],
  ['ratedPowerKw', 'rated_power_kw', 'float8', ''],
  ['speedRpm', 'speed_rpm', 'float8', ''],
  ['poles', 'poles', 'int', ''],
  ['voltageV', 'voltage_v', 'float8', ''],
  ['frequencyHz', 'frequency_hz', 'int', ''],
  ['ratedCurrentA', 'rated_current_a', 'float8', ''],
  ['efficiencyClass', 'efficiency_class', 'text', '::"enum_motors_efficiency_class"'],
  ['nameplateEfficiencyPct', 'nameplate_efficiency_pct', 'float8', ''],
  ['powerFactor', 'power_factor', 'float8', ''],
  ['frame', 'frame', 'text', ''],
  ['enclosure', 'enclosure', 'text', ''],
  ['manufacturer', 'manufacturer', 'text', ''],
  ['yearInstalled', 'year_installed', 'int', ''],
  ['rewinds', 'rewinds', 'int', ''],
  ['controlMethod', 'control_method', 'text', '::"enum_motors_control_method"'],
  ['hoursPerYear', 'hours_per_year', 'float8', ''],
  ['loadFactor', 'load_factor', 'float8', ''],
  ['dutyProfile', 'duty_profile', 'jsonb', ''],
  ['status', 'status', 'text', '::"enum_motors_status"'],
  ['notes', 'notes', 'text', ''],
];

const recordsetColumns = MOTOR_COLUMNS.map(([field, , type]) => `"${field}" ${type}`).join(', ');

/**
 * Stages rows in `import_rows`, a multi-row INSERT per chunk. The chunks may be produced lazily (a
 * generator that validates them): the next chunk is then validated in Node while PostgreSQL stores the
 * previous one, at most one INSERT in flight.
 */
export async function insertRows(batchId: number, chunks: Iterable<ValidatedRow[]>, transaction: Transaction): Promise<void> {
  let inFlight: Promise<unknown> | undefined;
  try {
    for (const rows of chunks) {
      const chunk = rows.map((row) => ({
        row_number: row.row,
        cells: row.cells,
        values: row.values,
        errors: row.errors,
        warnings: row.warnings,
        valid: row.valid,
        action: row.action,
        motor_id: row.motorId,
      }));
      const json = JSON.stringify(chunk);
      await inFlight;
      inFlight = database().query(
        `INSERT INTO import_rows (batch_id, row_number, cells, "values", errors, warnings, valid, action, motor_id)
         SELECT $1, r.row_number, r.cells, r."values", r.errors, r.warnings, r.valid, r.action, r.motor_id
         FROM jsonb_to_recordset($2::jsonb) AS r(row_number int, cells jsonb, "values" jsonb, errors jsonb, warnings jsonb, valid boolean, action text, motor_id int)`,
        { bind: [batchId, json], transaction, type: QueryTypes.INSERT },
      );
      // Let the query reach PostgreSQL before the next chunk's validation holds the event loop.
      await new Promise((resolve) => setImmediate(resolve));
    }
    await inFlight;
  } catch (error) {
    await inFlight?.catch(() => undefined);
    throw error;
  }
}

/** Rows in chunks of `size`, as a lazy sequence. */
export function* chunked<T>(rows: T[], size = CHUNK_ROWS): Generator<T[]> {
  for (let start = 0; start < rows.length; start += size) yield rows.slice(start, start + size);
}

/** Writes full motor values (as the commit kept them, with their `importBatchId`) back over motors by `id`, bumping their version: undo. */
export async function overwriteMotors(motors: Array<Record<string, unknown>>, transaction: Transaction): Promise<void> {
  if (motors.length === 0) return;
  const assignments = MOTOR_COLUMNS.map(([field, column, , cast]) => `${column} = v."${field}"${cast}`).join(', ');
  await database().query(
    `UPDATE motors AS m SET ${assignments}, import_batch_id = v."importBatchId", version = m.version + 1, updated_at = now()
     FROM jsonb_to_recordset($1::jsonb) AS v(id int, "importBatchId" int, ${recordsetColumns})
     WHERE m.id = v.id`,
    { bind: [JSON.stringify(motors)], transaction, type: QueryTypes.UPDATE },
  );
}

export async function insertAudits(
  organizationId: number,
  userId: number,
  entries: Array<{ action: string; entity_id: number; changes: Record<string, unknown> }>,
  transaction: Transaction,
): Promise<void> {
  if (entries.length === 0) return;
  await database().query(
    `INSERT INTO audit_logs (organization_id, user_id, action, entity, entity_id, changes, created_at)
     SELECT $1, $2, v.action, 'motor', v.entity_id, v.changes, now()
     FROM jsonb_to_recordset($3::jsonb) AS v(action text, entity_id int, changes jsonb)`,
    { bind: [organizationId, userId, JSON.stringify(entries)], transaction, type: QueryTypes.INSERT },
  );
}

/** A staged value as its motor column's type (`r` is the import row). */
function stagedValue(field: string, type: string, cast: string): string {
  return type === 'jsonb' ? `r."values"->'${field}'` : `(r."values"->>'${field}')::${type}${cast}`;
}

/** A motor's full values in the motor vocabulary, as undo restores them (`m` is the motor). */
const PREVIOUS_VALUES = `jsonb_build_object('id', m.id, 'version', m.version, 'importBatchId', m.import_batch_id, ${MOTOR_COLUMNS.map(
  ([field, column]) => `'${field}', m.${column}`,
).join(', ')})`;

/** Defaults of a created motor's columns the file left blank (the site's supply for voltage and frequency). */
const CREATE_DEFAULTS: Record<string, string> = {
  application: `'other'`,
  efficiencyClass: `'unknown'`,
  rewinds: '0',
  controlMethod: `'direct-on-line'`,
  status: `'in-service'`,
  voltageV: ':siteVoltageV',
  frequencyHz: ':siteFrequencyHz',
};

/** The batch's valid staging rows (`r`); `:batchId` bound. */
const VALID_ROWS = 'import_rows r WHERE r.batch_id = :batchId AND r.valid';

/**
 * The set-based statements of a commit, in order, all in the commit's transaction. Each one's
 * replacements: `:batchId`, `:siteId`, `:organizationId`, `:userId`, `:siteVoltageV`, `:siteFrequencyHz`.
 * Outcomes are gathered in a temporary table (dropped at the end of the transaction) and written to the
 * staging rows once, so each staging row is rewritten only once.
 */
export const commitStatements = {
  /** The valid rows to commit. */
  count: `SELECT count(*)::int AS count FROM ${VALID_ROWS}`,
  /**
   * The outcome table. For the transaction: JIT off, since the planner cannot size a fresh temporary
   * table or freshly staged rows and would compile these one-off statements (up to 0.5 s each, more than
   * it saves); and room to sort and hash 50,000 rows in memory rather than in temporary files.
   */
  outcomes: `SET LOCAL jit = off; SET LOCAL work_mem = '64MB';
     CREATE TEMPORARY TABLE import_commit_outcomes (row_id bigint PRIMARY KEY, action text NOT NULL, motor_id int NOT NULL, previous jsonb) ON COMMIT DROP`,
  /** Locks the motors the batch updates (by site and tag) and keeps their values before the commit, for undo. */
  lockUpdated: `INSERT INTO import_commit_outcomes (row_id, action, motor_id, previous)
     SELECT r.id, 'update', m.id, ${PREVIOUS_VALUES}
     FROM import_rows r JOIN motors m ON m.site_id = :siteId AND m.tag = r."values"->>'tag'
     WHERE r.batch_id = :batchId AND r.valid
     FOR UPDATE OF m`,
  /** Only the cells that hold a value change a motor. */
  updateMotors: `UPDATE motors AS m SET ${MOTOR_COLUMNS.map(
    ([field, column, type, cast]) => `${column} = CASE WHEN r."values" ? '${field}' THEN ${stagedValue(field, type, cast)} ELSE m.${column} END`,
  ).join(', ')}, import_batch_id = :batchId, version = m.version + 1, updated_at = now()
     FROM import_commit_outcomes o JOIN import_rows r ON r.id = o.row_id
     WHERE m.id = o.motor_id`,
  /**
   * Creates the motors of the other rows and records them. Their ids are drawn from the motors' own
   * sequence beforehand, so each row knows its motor without joining the created motors back by tag;
   * in the file's row order (PostgreSQL draws them after the sort), not the staged rows' storage order.
   */
  insertMotors: `WITH fresh AS MATERIALIZED (
       SELECT r.id AS row_id, r."values", nextval((SELECT pg_get_serial_sequence('motors', 'id'))::regclass)::int AS motor_id
       FROM ${VALID_ROWS} AND NOT EXISTS (SELECT 1 FROM import_commit_outcomes o WHERE o.row_id = r.id)
       ORDER BY r.row_number
     ), created AS (
       INSERT INTO motors (id, organization_id, site_id, import_batch_id, version, created_at, updated_at, ${MOTOR_COLUMNS.map(([, column]) => column).join(', ')})
       SELECT r.motor_id, :organizationId, :siteId, :batchId, 0, now(), now(), ${MOTOR_COLUMNS.map(([field, , type, cast]) =>
         CREATE_DEFAULTS[field] ? `coalesce(${stagedValue(field, type, cast)}, ${CREATE_DEFAULTS[field]}${cast})` : stagedValue(field, type, cast),
       ).join(', ')}
       FROM fresh r
     )
     INSERT INTO import_commit_outcomes (row_id, action, motor_id, previous) SELECT row_id, 'create', motor_id, NULL FROM fresh`,
  /** What the commit did to each row, for the preview and undo. */
  recordOutcomes: `UPDATE import_rows AS r SET action = o.action, motor_id = o.motor_id, previous = o.previous
     FROM import_commit_outcomes o WHERE r.id = o.row_id`,
  /** The change history of every motor the batch touched: a creation, or the fields it changed (from → to). */
  insertAudits: `INSERT INTO audit_logs (organization_id, user_id, action, entity, entity_id, changes, created_at)
     SELECT :organizationId, :userId, 'import-' || o.action, 'motor', o.motor_id,
       CASE WHEN o.action = 'create' THEN jsonb_build_object('importBatchId', :batchId, 'row', r.row_number)
       ELSE jsonb_build_object('importBatchId', :batchId, 'row', r.row_number, 'changes', (
         SELECT coalesce(jsonb_object_agg(v.key, jsonb_build_object('from', coalesce(o.previous->v.key, 'null'::jsonb), 'to', v.value)), '{}'::jsonb)
         FROM jsonb_each(r."values") AS v WHERE coalesce(o.previous->v.key, 'null'::jsonb) <> v.value))
       END,
       now()
     FROM import_commit_outcomes o JOIN import_rows r ON r.id = o.row_id`,
} as const;
