/**
 * Meter data CSV: a header row, then one row per reading — timestamp, value (kW or kWh), and
 * optionally one independent variable (running hours, production…). Parsed here, by hand, because
 * meter exports are messy and every problem must be reported against its row, never guessed away.
 *
 * Conventions (documented for users in the client and the report):
 * - Separator: ';' when the header has one, else a tab when it has one, else ','. Fields may be
 *   quoted ("…", with "" for a quote). Decimal comma or point: "12,5" and "12.5" are both 12.5; with
 *   both marks the last one is the decimal mark ("1.234,5", "1,234.5"); a single comma is a decimal comma.
 * - Timestamps: ISO 8601 (`2026-03-02 14:00`, `2026-03-02T14:00:00+01:00`, `…Z`) or day-first with dots
 *   (`02.03.2026 14:00`). Slashed dates are refused (day/month order is ambiguous). A timestamp marks the
 *   START of its interval. A file's timestamps either all carry the same UTC offset or none do; the
 *   series keeps wall-clock time (a naive 2026-03-02 14:00 stays 14:00), so days are the plant's days.
 * - Unit: from the value column's header ("kW", "kWh", "Power [kW]", "Energy (kWh)"), or the upload's
 *   `unit` field, which overrides the header; else each cell must carry it ("12.5 kW"). Never guessed.
 * - Register: 'interval' rows give the mean power [kW] or the energy [kWh] of the interval that starts
 *   at the timestamp; 'cumulative' rows give an energy counter [kWh] (the independent variable is then
 *   a counter too, e.g. a running-hours counter); the energy of an interval is the difference of
 *   successive readings.
 * - The typical interval is the median spacing of the timestamps; a spacing longer than 1.5 typical
 *   intervals is a gap, reported with its start and end and never filled: an interval register's row
 *   before a gap covers one typical interval, and a cumulative register's difference across a gap is
 *   left out (its energy is known, but not when it was used).
 */
import type { MeterGap, MeterPoint, MeterRegister, MeterRowError, MeterUnit } from '../shared/retrofit.js';

/** A spacing longer than this many typical intervals is a gap [-]. */
export const GAP_FACTOR = 1.5;
/** At most this many data rows per file (a year of 1-minute data). */
export const MAX_METER_ROWS = 600_000;

export interface ParsedMeterFile {
  rows: number;
  errors: MeterRowError[];
  gaps: MeterGap[];
  points: MeterPoint[];
  unit: MeterUnit | null;
  variableName: string | null;
  utcOffset: string | null;
  intervalMinutes: number;
}

interface CsvRecord {
  line: number;
  fields: string[];
}

/** Splits CSV text into records (quoted fields may hold separators, quotes and line breaks). */
export function splitCsv(text: string, separator: string): CsvRecord[] {
  const records: CsvRecord[] = [];
  let fields: string[] = [];
  let field = '';
  let quoted = false;
  let line = 1;
  let recordLine = 1;
  let fieldStarted = false;
  const endRecord = () => {
    fields.push(field);
    if (fields.length > 1 || fields[0]!.trim() !== '') records.push({ line: recordLine, fields });
    fields = [];
    field = '';
    fieldStarted = false;
  };
  for (let index = 0; index < text.length; index += 1) {
    const char = text[index]!;
    if (quoted) {
      if (char === '"') {
        if (text[index + 1] === '"') {
          field += '"';
          index += 1;
        } else quoted = false;
      } else {
        if (char === '\n') line += 1;
        field += char;
      }
      continue;
    }
    if (char === '"' && !fieldStarted && field.trim() === '') {
      quoted = true;
      fieldStarted = true;
      field = '';
    } else if (char === separator) {
      fields.push(field);
      field = '';
      fieldStarted = false;
    } else if (char === '\n' || char === '\r') {
      if (char === '\r' && text[index + 1] === '\n') index += 1;
      endRecord();
      line += 1;
      recordLine = line;
    } else {
      field += char;
      if (char !== ' ') fieldStarted = true;
    }
  }
  if (field !== '' || fields.length > 0) endRecord();
  return records;
}

function detectSeparator(text: string): string {
  const firstLine = text.slice(0, text.search(/\r|\n|$/));
  if (firstLine.includes(';')) return ';';
  if (firstLine.includes('\t')) return '\t';
  return ',';
}

/** The unit a header or cell names, or null ("Power [kW]" → kW; "kWh" is checked before "kW"). */
export function unitIn(text: string): MeterUnit | null {
  if (/(^|[^a-z])kwh($|[^a-z])/i.test(text)) return 'kWh';
  if (/(^|[^a-z])kw($|[^a-z])/i.test(text)) return 'kW';
  return null;
}

/** A number written with a decimal point or comma and optional thousands marks, or null. */
export function parseDecimal(raw: string): number | null {
  const text = raw.replace(/[\s\u00a0']/g, '');
  if (!/^[+-]?[\d.,]+$/.test(text) || !/\d/.test(text)) return null;
  const lastDot = text.lastIndexOf('.');
  const lastComma = text.lastIndexOf(',');
  const commas = (text.match(/,/g) ?? []).length;
  const dots = (text.match(/\./g) ?? []).length;
  // The decimal mark: the last of two different marks, a single comma, or a single dot.
  let decimal: '.' | ',' | null;
  if (lastDot >= 0 && lastComma >= 0) decimal = lastDot > lastComma ? '.' : ',';
  else if (commas === 1) decimal = ',';
  else if (dots === 1) decimal = '.';
  else decimal = null;
  const thousands = decimal === '.' ? ',' : decimal === ',' ? '.' : commas > 0 ? ',' : '.';
  if (decimal !== null && (decimal === '.' ? dots : commas) > 1) return null;
  const [whole = '', fraction] = decimal === null ? [text] : text.split(decimal);
  const sign = /^[+-]/.test(whole) ? whole[0]! : '';
  const digits = sign === '' ? whole : whole.slice(1);
  // Thousands marks only between groups of three digits ("1.234.567", "1,234.5").
  if (digits.includes(thousands) && !new RegExp(`^\\d{1,3}(\\${thousands}\\d{3})+$`).test(digits)) return null;
  if (fraction !== undefined && !/^\d*$/.test(fraction)) return null;
  const plain = `${sign}${digits.split(thousands).join('')}${fraction !== undefined ? `.${fraction}` : ''}`;
  if (!/^[+-]?(\d+\.?\d*|\.\d+)$/.test(plain)) return null;
  const value = Number(plain);
  return Number.isFinite(value) ? value : null;
}

export interface ParsedTimestamp {
  /** Wall-clock time as milliseconds since 1970 read as UTC. */
  wallMs: number;
  /** '+01:00', '+00:00' for Z, or null when the timestamp carries no offset. */
  offset: string | null;
}

const ISO_PATTERN = /^(\d{4})-(\d{2})-(\d{2})(?:[T ](\d{1,2}):(\d{2})(?::(\d{2})(?:[.,]\d+)?)?)?\s*(Z|[+-]\d{2}(?::?\d{2})?)?$/i;
const DOTTED_PATTERN = /^(\d{1,2})\.(\d{1,2})\.(\d{4})(?:[T ](\d{1,2}):(\d{2})(?::(\d{2}))?)?\s*(Z|[+-]\d{2}(?::?\d{2})?)?$/i;

function normaliseOffset(raw: string | undefined): string | null {
  if (raw === undefined) return null;
  if (raw.toUpperCase() === 'Z') return '+00:00';
  const digits = raw.replace(':', '');
  return `${digits.slice(0, 3)}:${digits.length > 3 ? digits.slice(3, 5) : '00'}`;
}

/** Parses one timestamp, or returns the reason it cannot be read. */
export function parseTimestamp(raw: string): ParsedTimestamp | { error: string } {
  const text = raw.trim();
  if (/^\d{1,4}\/\d{1,2}\/\d{1,4}/.test(text)) return { error: 'has an ambiguous day/month order; write dates as YYYY-MM-DD or DD.MM.YYYY' };
  let parts: string[] | null = null;
  const iso = ISO_PATTERN.exec(text);
  if (iso) parts = [iso[1]!, iso[2]!, iso[3]!, iso[4] ?? '0', iso[5] ?? '0', iso[6] ?? '0', iso[7] ?? ''];
  const dotted = iso ? null : DOTTED_PATTERN.exec(text);
  if (dotted) parts = [dotted[3]!, dotted[2]!, dotted[1]!, dotted[4] ?? '0', dotted[5] ?? '0', dotted[6] ?? '0', dotted[7] ?? ''];
  if (!parts) return { error: 'is not a date and time (use YYYY-MM-DD HH:MM, with an optional UTC offset)' };
  const [year, month, day, hour, minute, second] = parts.slice(0, 6).map(Number) as [number, number, number, number, number, number];
  const wallMs = Date.UTC(year, month - 1, day, hour, minute, second);
  const check = new Date(wallMs);
  if (check.getUTCFullYear() !== year || check.getUTCMonth() !== month - 1 || check.getUTCDate() !== day || hour > 23 || minute > 59 || second > 59) {
    return { error: 'is not a valid calendar date and time' };
  }
  return { wallMs, offset: normaliseOffset(parts[6] === '' ? undefined : parts[6]) };
}

/** Wall-clock ISO text of a series time (no zone suffix: it is the file's own clock). */
export function wallIso(wallMs: number): string {
  return new Date(wallMs).toISOString().slice(0, 19);
}

interface GoodRow {
  line: number;
  rawTimestamp: string;
  wallMs: number;
  value: number;
  variable: number | null;
}

const HOUR_MS = 3_600_000;

/**
 * Parses a meter CSV. With any row error the caller refuses the whole file; the points are then
 * empty. Gaps are computed from the readable rows either way, so the user sees them at once.
 * @param text file content (UTF-8)
 * @param options unit override, register kind
 */
export function parseMeterCsv(text: string, options: { unit?: MeterUnit | undefined; register: MeterRegister }): ParsedMeterFile {
  const errors: MeterRowError[] = [];
  const body = text.replace(/^\ufeff/, '');
  const result = (extra: Partial<ParsedMeterFile> = {}): ParsedMeterFile => ({
    rows: 0,
    errors,
    gaps: [],
    points: [],
    unit: null,
    variableName: null,
    utcOffset: null,
    intervalMinutes: 0,
    ...extra,
  });
  const records = splitCsv(body, detectSeparator(body));
  const header = records[0];
  if (!header) {
    errors.push({ row: 1, field: 'columns', value: '', message: 'the file is empty; expected a header row (timestamp, value) and readings' });
    return result();
  }
  const names = header.fields.map((name) => name.trim());
  if (names.length < 2 || names.length > 3) {
    errors.push({
      row: header.line,
      field: 'columns',
      value: names.join(' | '),
      message: `has ${names.length} columns; expected a timestamp, a value in kW or kWh, and at most one independent variable`,
    });
    return result();
  }
  if (!/time|date|stamp|zeit|datum|start|interval|period|hora|heure|fecha/i.test(names[0]!) || parseDecimal(names[1]!) !== null || !('error' in parseTimestamp(names[0]!))) {
    errors.push({ row: header.line, field: 'columns', value: names[0]!, message: 'the first row must be a header whose first column is the timestamp (e.g. "timestamp;Power [kW]")' });
    return result();
  }
  const variableName = names[2] && names[2] !== '' ? names[2].slice(0, 80) : null;
  if (records.length - 1 > MAX_METER_ROWS) {
    errors.push({ row: header.line, field: 'rows', value: String(records.length - 1), message: `has more than ${MAX_METER_ROWS} readings; split the file` });
    return result();
  }
  const headerUnit = unitIn(names[1]!);
  let unit: MeterUnit | null = options.unit ?? headerUnit;
  if (unit === null && !records.slice(1).some((record) => unitIn(record.fields[1] ?? '') !== null)) {
    errors.push({ row: header.line, field: 'unit', value: names[1]!, message: 'no unit: name it in the value column header ("Power [kW]", "Energy [kWh]") or choose kW or kWh for the upload' });
    return result({ variableName });
  }

  let firstOffset: { offset: string | null; line: number } | null = null;
  const good: GoodRow[] = [];
  let cellUnit: MeterUnit | null = null;
  for (const record of records.slice(1)) {
    const { line, fields } = record;
    if (fields.length !== names.length) {
      errors.push({ row: line, field: 'columns', value: fields.join(' | ').slice(0, 200), message: `has ${fields.length} fields; the header has ${names.length}` });
      continue;
    }
    let rowOk = true;
    const timestamp = parseTimestamp(fields[0]!);
    if ('error' in timestamp) {
      errors.push({ row: line, field: 'timestamp', value: fields[0]!, message: timestamp.error });
      rowOk = false;
    } else if (firstOffset === null) firstOffset = { offset: timestamp.offset, line };
    else if (timestamp.offset !== firstOffset.offset) {
      const describe = (offset: string | null) => (offset === null ? 'no UTC offset' : `UTC offset ${offset}`);
      errors.push({
        row: line,
        field: 'timestamp',
        value: fields[0]!,
        message: `mixed time zones: this row has ${describe(timestamp.offset)}, row ${firstOffset.line} has ${describe(firstOffset.offset)}; export every row in one zone`,
      });
      rowOk = false;
    }
    const rawValue = fields[1]!.trim();
    const valueUnit = unitIn(rawValue);
    const numeric = parseDecimal(rawValue.replace(/k\s*wh?$/i, ''));
    if (numeric === null) {
      errors.push({ row: line, field: 'value', value: rawValue, message: rawValue === '' ? 'is empty' : 'is not a number' });
      rowOk = false;
    } else if (options.unit === undefined && headerUnit === null) {
      // Units only in the cells: every cell must carry one, and the same one.
      if (valueUnit === null) {
        errors.push({ row: line, field: 'value', value: rawValue, message: 'has no unit (kW or kWh), and neither has the header' });
        rowOk = false;
      } else if (cellUnit !== null && valueUnit !== cellUnit) {
        errors.push({ row: line, field: 'value', value: rawValue, message: `is in ${valueUnit}, earlier rows in ${cellUnit}` });
        rowOk = false;
      } else cellUnit = valueUnit;
    }
    if (numeric !== null && numeric < 0) {
      errors.push({ row: line, field: 'value', value: rawValue, message: unit === 'kW' || cellUnit === 'kW' ? 'is a negative power' : 'is a negative energy' });
      rowOk = false;
    }
    let variable: number | null = null;
    if (variableName !== null) {
      const rawVariable = fields[2]!.trim();
      variable = parseDecimal(rawVariable);
      if (variable === null) {
        errors.push({ row: line, field: variableName, value: rawVariable, message: rawVariable === '' ? 'is empty' : 'is not a number' });
        rowOk = false;
      } else if (variable < 0) {
        errors.push({ row: line, field: variableName, value: rawVariable, message: 'is negative' });
        rowOk = false;
      }
    }
    if (rowOk && !('error' in timestamp)) good.push({ line, rawTimestamp: fields[0]!.trim(), wallMs: timestamp.wallMs, value: numeric!, variable });
  }
  unit ??= cellUnit;
  if (unit === null) return result({ variableName });
  if (options.register === 'cumulative' && unit !== 'kWh') {
    errors.unshift({ row: header.line, field: 'unit', value: names[1]!, message: 'a cumulative register counts energy: its unit must be kWh' });
  }

  // Readings in time order; the same instant twice is an error on the later row of the file.
  good.sort((a, b) => a.wallMs - b.wallMs || a.line - b.line);
  const ordered: GoodRow[] = [];
  for (const row of good) {
    const previous = ordered[ordered.length - 1];
    if (previous && previous.wallMs === row.wallMs) {
      const [first, later] = previous.line < row.line ? [previous, row] : [row, previous];
      errors.push({ row: later.line, field: 'timestamp', value: later.rawTimestamp, message: `duplicated timestamp (also on row ${first.line})` });
      if (later === previous) ordered[ordered.length - 1] = row;
      continue;
    }
    ordered.push(row);
  }
  if (options.register === 'cumulative') {
    for (let index = 1; index < ordered.length; index += 1) {
      const previous = ordered[index - 1]!;
      const row = ordered[index]!;
      if (row.value < previous.value) {
        errors.push({ row: row.line, field: 'value', value: String(row.value), message: `the cumulative register goes backwards (from ${previous.value} on row ${previous.line})` });
      }
      if (variableName !== null && row.variable !== null && previous.variable !== null && row.variable < previous.variable) {
        errors.push({ row: row.line, field: variableName, value: String(row.variable), message: `the cumulative counter goes backwards (from ${previous.variable} on row ${previous.line})` });
      }
    }
  }
  if (ordered.length < 2) {
    if (errors.length === 0) errors.push({ row: header.line, field: 'rows', value: String(ordered.length), message: 'needs at least two readable readings' });
    return result({ unit, variableName });
  }

  const spacings = ordered.slice(1).map((row, index) => row.wallMs - ordered[index]!.wallMs).sort((a, b) => a - b);
  const typicalMs = spacings[Math.floor((spacings.length - 1) / 2)]!;
  const gaps: MeterGap[] = [];
  const points: MeterPoint[] = [];
  for (let index = 0; index < ordered.length; index += 1) {
    const row = ordered[index]!;
    const next = ordered[index + 1];
    const spacing = next ? next.wallMs - row.wallMs : typicalMs;
    const isGap = spacing > GAP_FACTOR * typicalMs;
    if (options.register === 'interval') {
      const durationMs = Math.min(spacing, typicalMs);
      const hours = durationMs / HOUR_MS;
      points.push([row.wallMs, hours, unit === 'kW' ? row.value * hours : row.value, row.variable]);
      if (isGap && next) gaps.push({ start: wallIso(row.wallMs + durationMs), end: wallIso(next.wallMs), hours: (next.wallMs - row.wallMs - durationMs) / HOUR_MS, afterRow: row.line });
    } else if (next) {
      if (isGap) gaps.push({ start: wallIso(row.wallMs), end: wallIso(next.wallMs), hours: spacing / HOUR_MS, afterRow: row.line });
      else {
        const variable = row.variable !== null && next.variable !== null ? next.variable - row.variable : null;
        points.push([row.wallMs, spacing / HOUR_MS, next.value - row.value, variable]);
      }
    }
  }
  errors.sort((a, b) => a.row - b.row);
  return {
    rows: ordered.length,
    errors,
    gaps,
    points: errors.length > 0 ? [] : points,
    unit,
    variableName,
    utcOffset: firstOffset?.offset ?? null,
    intervalMinutes: typicalMs / 60_000,
  };
}
