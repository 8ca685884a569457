/**
 * The register (filtered, sorted) as an .xlsx workbook. Columns are the import template's, so an
 * export can be edited and imported back. Text that a spreadsheet program would read as a formula
 * (starting with =, +, -, −, @, tab or carriage return) is prefixed with a single quote.
 */
import * as XLSX from 'xlsx';
import { orderFrom } from '../lib/lists.js';
import { tooLarge } from '../lib/errors.js';
import type { Tenant } from '../lib/tenant.js';
import { Motor } from '../models/index.js';
import { IMPORT_FIELD_INFO } from '../shared/intake.js';
import { MOTOR_EXPORT_MAX_ROWS, type MotorExportQuery } from '../shared/motor.js';
import { motorWhere } from './filters.js';
import { siteNames } from './service.js';

const FORMULA_START = /^[=+\-\u2212@\t\r]/;

/** Text a spreadsheet program will show as text, never evaluate. */
export function neutraliseFormula(text: string): string {
  return FORMULA_START.test(text) ? `'${text}` : text;
}

function cellOf(value: unknown): string | number | null {
  if (value === null || value === undefined) return null;
  if (typeof value === 'number') return value;
  if (Array.isArray(value)) return (value as Array<{ fraction: number; hours: number }>).map((bin) => `${bin.fraction}:${bin.hours}`).join('; ');
  return neutraliseFormula(String(value));
}

export async function exportMotors(tenant: Tenant, query: MotorExportQuery): Promise<Buffer> {
  const where = motorWhere(query);
  const total = await tenant.count(Motor, { where });
  if (total > MOTOR_EXPORT_MAX_ROWS) throw tooLarge(`The filter matches ${total} motors; at most ${MOTOR_EXPORT_MAX_ROWS} can be exported at once. Narrow the filter.`);
  const motors = await tenant.findAll(Motor, { where, order: orderFrom(query.sort), raw: true });
  const names = await siteNames(tenant, motors.map((motor) => motor.siteId));
  const header = ['Site', ...IMPORT_FIELD_INFO.map((info) => info.label)];
  const rows: Array<Array<string | number | null>> = [header];
  for (const motor of motors) {
    rows.push([
      neutraliseFormula(names.get(motor.siteId) ?? ''),
      ...IMPORT_FIELD_INFO.map((info) => cellOf((motor as unknown as Record<string, unknown>)[info.field])),
    ]);
  }
  const sheet = XLSX.utils.aoa_to_sheet(rows);
  sheet['!cols'] = header.map((name) => ({ wch: Math.max(10, name.length + 2) }));
  const workbook = XLSX.utils.book_new();
  XLSX.utils.book_append_sheet(workbook, sheet, 'Motors');
  return XLSX.write(workbook, { type: 'buffer', bookType: 'xlsx', compression: true }) as Buffer;
}
