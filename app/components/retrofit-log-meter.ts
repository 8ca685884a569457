// A first look at a meter file in the browser, before it is sent: its columns as the server will
// read them (timestamp, value, optional independent variable), the unit its header names, and its
// first readings. Validation stays on the server (server/retrofits/meter-csv.ts), which answers
// every problem with its row; this only shows the user what they are about to upload.
import type { MeterUnit } from 'shared/retrofit';

export interface MeterFilePreview {
  separator: ',' | ';' | '\t';
  header: string[];
  /** The first data rows, split into fields. */
  rows: string[][];
  /** Non-empty lines after the header. */
  dataRows: number;
  /** The unit the value column's header names ("Power [kW]" → kW), or null. */
  headerUnit: MeterUnit | null;
  /** The third column's name: an independent variable (running hours, production…). */
  variableName: string | null;
  /** Why the server will refuse the file outright, when that is plain from the header. */
  problem: string | null;
}

/** The separator the server picks: ';' if the header has one, else a tab, else ','. */
export function detectSeparator(headerLine: string): ',' | ';' | '\t' {
  if (headerLine.includes(';')) return ';';
  if (headerLine.includes('\t')) return '\t';
  return ',';
}

/** The unit named in a header, as the server reads it ("kWh" before "kW"). */
export function unitInHeader(text: string): MeterUnit | null {
  if (/(^|[^a-z])kwh($|[^a-z])/i.test(text)) return 'kWh';
  if (/(^|[^a-z])kw($|[^a-z])/i.test(text)) return 'kW';
  return null;
}

/** Fields of one line; quotes ("…", "" for a quote) may hold the separator. */
export function splitLine(line: string, separator: string): string[] {
  const fields: string[] = [];
  let field = '';
  let quoted = false;
  for (let index = 0; index < line.length; index += 1) {
    const char = line[index]!;
    if (quoted) {
      if (char === '"' && line[index + 1] === '"') {
        field += '"';
        index += 1;
      } else if (char === '"') quoted = false;
      else field += char;
    } else if (char === '"' && field.trim() === '') {
      quoted = true;
      field = '';
    } else if (char === separator) {
      fields.push(field.trim());
      field = '';
    } else field += char;
  }
  fields.push(field.trim());
  return fields;
}

/** The preview of a meter file's text (see the module comment). */
export function previewMeterText(text: string, maxRows = 6): MeterFilePreview {
  const lines = text
    .replace(/^\ufeff/, '')
    .split(/\r\n|\n|\r/)
    .filter((line) => line.trim() !== '');
  const headerLine = lines[0] ?? '';
  const separator = detectSeparator(headerLine);
  const header = headerLine === '' ? [] : splitLine(headerLine, separator);
  let problem: string | null = null;
  if (header.length === 0) problem = 'The file is empty.';
  else if (header.length < 2 || header.length > 3) {
    problem = `The header has ${header.length} column${header.length === 1 ? '' : 's'}; a meter file has a timestamp, a value in kW or kWh, and at most one independent variable.`;
  }
  return {
    separator,
    header,
    rows: lines.slice(1, 1 + maxRows).map((line) => splitLine(line, separator)),
    dataRows: Math.max(0, lines.length - 1),
    headerUnit: header[1] ? unitInHeader(header[1]) : null,
    variableName: header[2] ? header[2] : null,
    problem,
  };
}

/** The row-level problems a refused upload carries in `details` (server/retrofits/meter-data.ts). */
export interface MeterRefusal {
  rows: number;
  errorCount: number;
  errors: Array<{ row: number; field: string; value: string; message: string }>;
  gaps: Array<{ start: string; end: string; hours: number; afterRow: number }>;
}

export function meterRefusalFrom(details: unknown): MeterRefusal | null {
  if (typeof details !== 'object' || details === null || !Array.isArray((details as { errors?: unknown }).errors)) return null;
  const value = details as Partial<MeterRefusal>;
  return {
    rows: value.rows ?? 0,
    errorCount: value.errorCount ?? value.errors!.length,
    errors: value.errors!,
    gaps: Array.isArray(value.gaps) ? value.gaps : [],
  };
}
