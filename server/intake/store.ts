/**
 * Bulk SQL of the Intake. A 50,000-row batch is written in chunks of multi-row statements fed by
 * `jsonb_to_recordset`, not row by row: one round trip per chunk keeps an import within seconds.
 */
import { QueryTypes, type Transaction } from 'sequelize';
import { database } from '../lib/database.js';
import type { ValidatedRow } from './validate.js';

export const CHUNK_ROWS = 2000;

/** Motor fields written by an import: field → [column, recordset type, cast]. */
export const MOTOR_COLUMNS: ReadonlyArray<readonly [field: string, column: string, type: string, cast: string]> = [
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

export async function insertRows(batchId: number, rows: ValidatedRow[], transaction: Transaction): Promise<void> {
  for (let start = 0; start < rows.length; start += CHUNK_ROWS) {
    const chunk = rows.slice(start, start + CHUNK_ROWS).map((row) => ({
      row_number: row.row,
      cells: row.cells,
      values: row.values,
      errors: row.errors,
      warnings: row.warnings,
      valid: row.valid,
      action: row.action,
      motor_id: row.motorId,
    }));
    await database().query(
      `INSERT INTO import_rows (batch_id, row_number, cells, "values", errors, warnings, valid, action, motor_id)
       SELECT $1, r.row_number, r.cells, r."values", r.errors, r.warnings, r.valid, r.action, r.motor_id
       FROM jsonb_to_recordset($2::jsonb) AS r(row_number int, cells jsonb, "values" jsonb, errors jsonb, warnings jsonb, valid boolean, action text, motor_id int)`,
      { bind: [batchId, JSON.stringify(chunk)], transaction, type: QueryTypes.INSERT },
    );
  }
}

/** Inserts new motors; answers their ids by tag (tags are unique within a site and a batch). */
export async function insertMotors(
  organizationId: number,
  siteId: number,
  batchId: number,
  motors: Array<Record<string, unknown>>,
  transaction: Transaction,
): Promise<Map<string, number>> {
  if (motors.length === 0) return new Map();
  const columns = MOTOR_COLUMNS.map(([, column]) => column).join(', ');
  const selected = MOTOR_COLUMNS.map(([field, , , cast]) => `v."${field}"${cast}`).join(', ');
  const rows = await database().query<{ id: number; tag: string }>(
    `INSERT INTO motors (organization_id, site_id, import_batch_id, version, created_at, updated_at, ${columns})
     SELECT $1, $2, $3, 0, now(), now(), ${selected}
     FROM jsonb_to_recordset($4::jsonb) AS v(${recordsetColumns})
     RETURNING id, tag`,
    { bind: [organizationId, siteId, batchId, JSON.stringify(motors)], transaction, type: QueryTypes.SELECT },
  );
  return new Map(rows.map((row) => [row.tag, row.id]));
}

/** Writes full motor values over existing motors (by `id`), bumping their version. */
export async function overwriteMotors(motors: Array<Record<string, unknown>>, transaction: Transaction, importBatchIdFrom: 'value' | number): Promise<void> {
  if (motors.length === 0) return;
  const assignments = MOTOR_COLUMNS.map(([field, column, , cast]) => `${column} = v."${field}"${cast}`).join(', ');
  const batchAssignment = importBatchIdFrom === 'value' ? 'v."importBatchId"' : String(Number(importBatchIdFrom));
  await database().query(
    `UPDATE motors AS m SET ${assignments}, import_batch_id = ${batchAssignment}, version = m.version + 1, updated_at = now()
     FROM jsonb_to_recordset($1::jsonb) AS v(id int, "importBatchId" int, ${recordsetColumns})
     WHERE m.id = v.id`,
    { bind: [JSON.stringify(motors)], transaction, type: QueryTypes.UPDATE },
  );
}

export async function recordRowOutcomes(
  outcomes: Array<{ id: number; action: string; motor_id: number; previous: Record<string, unknown> | null }>,
  transaction: Transaction,
): Promise<void> {
  if (outcomes.length === 0) return;
  await database().query(
    `UPDATE import_rows AS r SET action = v.action, motor_id = v.motor_id, previous = v.previous
     FROM jsonb_to_recordset($1::jsonb) AS v(id bigint, action text, motor_id int, previous jsonb)
     WHERE r.id = v.id`,
    { bind: [JSON.stringify(outcomes)], transaction, type: QueryTypes.UPDATE },
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
