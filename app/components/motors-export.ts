// The register's selected motors as an .xlsx workbook, written in the browser. Same layout as the
// server's export (GET /api/motors/export: a Site column, then the import template's columns), so a
// selection can be edited and imported back; text a spreadsheet would evaluate as a formula is
// prefixed with a quote, as the server does. Loaded only when used (the library is large).
import type { MotorOutput } from 'shared/motor';
import { IMPORT_FIELD_INFO } from 'shared/intake';

const FORMULA_START = /^[=+\-\u2212@\t\r]/;

/** Text a spreadsheet program shows as text and never evaluates. */
export function neutraliseFormula(text: string): string {
  return FORMULA_START.test(text) ? `'${text}` : text;
}

function cellOf(value: unknown): string | number | null {
  if (value === null || value === undefined) return null;
  if (typeof value === 'number') return value;
  if (Array.isArray(value)) return (value as { fraction: number; hours: number }[]).map((bin) => `${bin.fraction}:${bin.hours}`).join('; ');
  return neutraliseFormula(String(value));
}

/** The rows of the sheet: a header, then one row per motor. */
export function selectedMotorsRows(motors: readonly MotorOutput[]): (string | number | null)[][] {
  const header = ['Site', ...IMPORT_FIELD_INFO.map((info) => info.label)];
  return [
    header,
    ...motors.map((motor) => [
      neutraliseFormula(motor.siteName),
      ...IMPORT_FIELD_INFO.map((info) => cellOf((motor as unknown as Record<string, unknown>)[info.field])),
    ]),
  ];
}

export async function selectedMotorsWorkbook(motors: readonly MotorOutput[]): Promise<Blob> {
  const XLSX = await import('xlsx');
  const rows = selectedMotorsRows(motors);
  const sheet = XLSX.utils.aoa_to_sheet(rows);
  sheet['!cols'] = (rows[0] ?? []).map((name) => ({ wch: Math.max(10, String(name).length + 2) }));
  const workbook = XLSX.utils.book_new();
  XLSX.utils.book_append_sheet(workbook, sheet, 'Motors');
  const bytes = XLSX.write(workbook, { type: 'array', bookType: 'xlsx', compression: true }) as ArrayBuffer;
  return new Blob([bytes], { type: 'application/vnd.openxmlformats-officedocument.spreadsheetml.sheet' });
}
