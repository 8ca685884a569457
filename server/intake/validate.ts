/**
 * Every cell of every row validated: parsed with its column's unit, checked with the register's own
 * field rules (server/shared/motor.ts, which agree with calc), then the row's cross-field checks and
 * warnings, and the duplicates within the file and against the register.
 *
 * Policies (README and the API tests rely on them):
 * - A row with any error is skipped by the commit; the other rows are committed together or not at all.
 * - A tag found at the site updates that motor; only the cells that hold a value change it (a blank
 *   cell never erases what the register knows).
 * - A new motor needs tag, rated power and poles (or a speed to work poles out from); voltage and
 *   frequency default to the site's.
 * - A tag on several rows of one file is an error on each of those rows: the user picks which to keep.
 */
import { iecClassEfficiency, type Poles } from '../../calc/efficiency/classes.js';
import { IMPORT_FIELD_INFO, type ImportField, type ImportMapping, type RowIssue } from '../shared/intake.js';
import { motorFieldRules } from '../shared/motor.js';
import {
  parseApplication,
  parseControlMethod,
  parseDutyProfile,
  parseEfficiencyClass,
  parseFraction,
  parseInteger,
  parsePercent,
  parsePoles,
  parseQuantity,
  parseStatus,
  parseText,
  type CellResult,
  type CellValue,
} from './cells.js';
import { headerUnit } from './mapping.js';

export interface ParsedRow {
  /** Spreadsheet row number the user sees. */
  row: number;
  cells: CellValue[];
}

export interface ValidatedRow extends ParsedRow {
  values: Record<string, unknown>;
  errors: RowIssue[];
  warnings: RowIssue[];
  valid: boolean;
  action: 'create' | 'update' | 'skip';
  motorId: number | null;
}

/** Counts and duplicates of the rows validated so far. */
export interface ValidationSummary {
  counts: { total: number; valid: number; invalid: number; warnings: number };
  duplicates: { inFile: Array<{ tag: string; rows: number[] }>; inRegister: Array<{ tag: string; row: number; motorId: number }> };
}

type ColumnReader = (cell: CellValue) => CellResult<unknown>;

/** A cell read and checked against its field's rule: a value (with an optional note), blank, or the reason it fails. */
type CellOutcome = { kind: 'value'; value: unknown; note?: string | undefined } | { kind: 'blank' } | { kind: 'error'; message: string };

/**
 * Distinct cells remembered per column. A motor list repeats most of its cells (ratings, voltages,
 * classes, frames), so each distinct cell is read and checked once; a column of unique cells (tags,
 * descriptions) stops filling its memory at this size.
 */
const CELL_MEMORY = 4096;

interface Column {
  index: number;
  field: ImportField;
  read: ColumnReader;
  header: string;
  memory: Map<CellValue, CellOutcome>;
}

/** Reads and checks one cell of a column, through the column's memory of the cells it has seen. */
function outcomeOf(column: Column, cell: CellValue): CellOutcome {
  const remembered = column.memory.get(cell);
  if (remembered !== undefined) return remembered;
  let outcome: CellOutcome;
  const result = column.read(cell);
  if (!result.ok) outcome = { kind: 'error', message: result.message };
  else if (result.value === null) outcome = { kind: 'blank' };
  else {
    const checked = motorFieldRules[column.field].safeParse(result.value);
    outcome = checked.success ? { kind: 'value', value: checked.data, note: result.note } : { kind: 'error', message: checked.error.issues[0]?.message ?? 'is invalid' };
  }
  // Only plain values are shared between rows (a duty profile's bins are an object of the row's own).
  const shareable = outcome.kind !== 'value' || outcome.value === null || typeof outcome.value !== 'object';
  if (shareable && column.memory.size < CELL_MEMORY) column.memory.set(cell, outcome);
  return outcome;
}

const QUANTITIES: Partial<Record<ImportField, { target: string; accepted: string; units: string[] }>> = {
  ratedPowerKw: { target: 'kW', accepted: 'kW, W or hp', units: ['kW', 'W', 'MW', 'hp', 'PS'] },
  speedRpm: { target: 'rpm', accepted: 'rpm', units: ['rpm'] },
  voltageV: { target: 'V', accepted: 'V or kV', units: ['V', 'kV'] },
  frequencyHz: { target: 'Hz', accepted: 'Hz', units: ['Hz'] },
  ratedCurrentA: { target: 'A', accepted: 'A', units: ['A', 'mA'] },
  hoursPerYear: { target: 'h/yr', accepted: 'h/yr, h/week or h/day', units: ['h/yr', 'h/y', 'h/a', 'h/year', 'h/week', 'h/wk', 'h/day', 'h/d'] },
};

/** The reader of one column: its field's parser, with the header's unit where one is written. */
function columnReader(field: ImportField, header: string): ColumnReader {
  const quantity = QUANTITIES[field];
  if (quantity) {
    const unit = headerUnit(header);
    const columnUnit = unit !== undefined && quantity.units.includes(unit) ? unit : quantity.target;
    const options = { target: quantity.target, columnUnit, accepted: quantity.accepted };
    return (cell) => parseQuantity(cell, options);
  }
  switch (field) {
    case 'application':
      return parseApplication;
    case 'controlMethod':
      return parseControlMethod;
    case 'efficiencyClass':
      return parseEfficiencyClass;
    case 'status':
      return parseStatus;
    case 'nameplateEfficiencyPct':
      return parsePercent;
    case 'powerFactor':
    case 'loadFactor': {
      const percent = headerUnit(header) === '%';
      return (cell) => parseFraction(cell, percent);
    }
    case 'poles':
      return parsePoles;
    case 'yearInstalled':
    case 'rewinds':
      return parseInteger;
    case 'dutyProfile':
      return parseDutyProfile;
    default:
      return parseText;
  }
}

const cellText = (cell: CellValue | undefined): string | null => (cell === null || cell === undefined ? null : String(cell).slice(0, 200));

/** Synchronous speed [rpm] = 120 · f / p. */
const synchronousRpm = (frequencyHz: number, poles: number) => (120 * frequencyHz) / poles;

/** Poles from a rated speed: the largest even p whose synchronous speed is above it. */
function polesFromSpeed(speedRpm: number, frequencyHz: number): number | undefined {
  const ratio = (120 * frequencyHz) / speedRpm;
  let poles = Math.floor(ratio);
  if (poles % 2 === 1) poles -= 1;
  if (poles >= 2 && poles * speedRpm === 120 * frequencyHz) poles -= 2; // exactly synchronous: no slip
  return [2, 4, 6, 8].includes(poles) ? poles : undefined;
}

export interface ValidationContext {
  headers: string[];
  mapping: ImportMapping;
  site: { voltageV: number; frequencyHz: number };
  /** Motors of the site by tag. */
  existing: Map<string, number>;
  currentYear: number;
}

/** A validation under way: the file's summary is known up front, its rows are validated chunk by chunk. */
export interface Validation {
  unmappedRequired: string[];
  /** Validates the next rows (in file order), with their duplicate and register checks. */
  validate(rows: ParsedRow[]): ValidatedRow[];
  /** Counts and duplicates of the rows validated so far. */
  summary(): ValidationSummary;
}

/**
 * Starts the validation of a file's rows. The tags are read first, so a tag on several rows is an
 * error on each of them whichever chunk they fall in; the rows can then be validated (and staged)
 * chunk by chunk, the next chunk validated while PostgreSQL stores the previous one.
 */
export function startValidation(rows: ParsedRow[], context: ValidationContext): Validation {
  const columns: Column[] = [];
  context.headers.forEach((header, index) => {
    const field = context.mapping[header];
    if (field) columns.push({ index, field, read: columnReader(field, header), header, memory: new Map() });
  });
  const mapped = new Set(columns.map((column) => column.field));
  const unmappedRequired: string[] = [];
  if (!mapped.has('tag')) unmappedRequired.push('tag');
  if (!mapped.has('ratedPowerKw')) unmappedRequired.push('ratedPowerKw');
  if (!mapped.has('poles') && !mapped.has('speedRpm')) unmappedRequired.push('poles');

  // Duplicates within the file: the rows of each tag, as validateRow will read it (the last tag column with a value).
  const tagColumns = columns.filter((column) => column.field === 'tag');
  const rowsByTag = new Map<string, number[]>();
  for (const parsed of rows) {
    let tag: unknown;
    for (const column of tagColumns) {
      const outcome = outcomeOf(column, parsed.cells[column.index] ?? null);
      if (outcome.kind === 'value') tag = outcome.value;
    }
    if (typeof tag !== 'string') continue;
    const list = rowsByTag.get(tag);
    if (list) list.push(parsed.row);
    else rowsByTag.set(tag, [parsed.row]);
  }
  const inFile: Array<{ tag: string; rows: number[] }> = [];
  for (const [tag, numbers] of rowsByTag) if (numbers.length > 1) inFile.push({ tag, rows: numbers });

  const fieldIndex = fieldColumns(columns);
  const inRegister: Array<{ tag: string; row: number; motorId: number }> = [];
  let total = 0;
  let valid = 0;
  let warnings = 0;
  return {
    unmappedRequired,
    validate(chunk) {
      return chunk.map((parsed) => {
        const row = validateRow(parsed, columns, fieldIndex, context);
        const tag = row.values.tag;
        const numbers = typeof tag === 'string' ? rowsByTag.get(tag) : undefined;
        if (numbers && numbers.length > 1) {
          row.errors.push({ row: row.row, field: 'tag', value: tag as string, message: `appears more than once in this file (rows ${numbers.join(', ')}); keep one` });
        }
        const motorId = typeof tag === 'string' ? context.existing.get(tag) : undefined;
        if (motorId !== undefined && typeof tag === 'string') inRegister.push({ tag, row: row.row, motorId });
        if (motorId === undefined) requireForCreate(row);
        row.valid = row.errors.length === 0;
        row.motorId = motorId ?? null;
        row.action = !row.valid ? 'skip' : motorId === undefined ? 'create' : 'update';
        total += 1;
        if (row.valid) valid += 1;
        if (row.warnings.length > 0) warnings += 1;
        return row;
      });
    },
    summary() {
      return { counts: { total, valid, invalid: total - valid, warnings }, duplicates: { inFile, inRegister } };
    },
  };
}

/** A new motor needs its rated power and poles; the others have defaults. */
function requireForCreate(row: ValidatedRow): void {
  const failed = new Set(row.errors.map((issue) => issue.field));
  if (row.values.ratedPowerKw === undefined && !failed.has('ratedPowerKw')) {
    row.errors.push({ row: row.row, field: 'ratedPowerKw', value: null, message: 'is required' });
  }
  if (row.values.poles === undefined && !failed.has('poles') && !failed.has('speedRpm')) {
    row.errors.push({ row: row.row, field: 'poles', value: null, message: 'is required (or a speed to work it out from)' });
  }
}

/** Column of each field (the last one when several map to it), for the messages that quote a cell. */
function fieldColumns(columns: Column[]): Map<ImportField, number> {
  return new Map(columns.map((column) => [column.field, column.index]));
}

function validateRow(parsed: ParsedRow, columns: Column[], fieldIndex: Map<ImportField, number>, context: ValidationContext): ValidatedRow {
  const values: Record<string, unknown> = {};
  const errors: RowIssue[] = [];
  const warnings: RowIssue[] = [];
  // A cell turned into text only for the messages that quote it.
  const rawText = (field: ImportField) => {
    const index = fieldIndex.get(field);
    return index === undefined ? null : cellText(parsed.cells[index] ?? null);
  };
  for (const column of columns) {
    const cell = parsed.cells[column.index] ?? null;
    const outcome = outcomeOf(column, cell);
    if (outcome.kind === 'error') {
      errors.push({ row: parsed.row, field: column.field, value: cellText(cell), message: outcome.message });
      continue;
    }
    if (outcome.kind === 'blank') continue;
    values[column.field] = outcome.value;
    if (outcome.note && column.field === 'efficiencyClass') warnings.push({ row: parsed.row, field: column.field, value: cellText(cell), message: outcome.note });
  }
  if (values.tag === undefined && !errors.some((issue) => issue.field === 'tag')) {
    errors.push({ row: parsed.row, field: 'tag', value: rawText('tag'), message: 'is required' });
  }

  const frequencyHz = (values.frequencyHz as number | undefined) ?? context.site.frequencyHz;
  const speedRpm = values.speedRpm as number | undefined;
  if (values.poles === undefined && speedRpm !== undefined) {
    const poles = polesFromSpeed(speedRpm, frequencyHz);
    if (poles === undefined) {
      errors.push({ row: parsed.row, field: 'speedRpm', value: rawText('speedRpm'), message: `does not give 2, 4, 6 or 8 poles at ${frequencyHz} Hz; give the poles` });
    } else {
      values.poles = poles;
      warnings.push({ row: parsed.row, field: 'poles', value: null, message: `worked out as ${poles} from ${speedRpm} rpm at ${frequencyHz} Hz` });
    }
  } else if (values.poles !== undefined && speedRpm !== undefined) {
    const synchronous = synchronousRpm(frequencyHz, values.poles as number);
    if (speedRpm > synchronous * 1.001 || speedRpm < synchronous * 0.8) {
      warnings.push({
        row: parsed.row,
        field: 'speedRpm',
        value: rawText('speedRpm'),
        message: `${speedRpm} rpm does not fit ${values.poles as number} poles at ${frequencyHz} Hz (synchronous speed ${synchronous} rpm)`,
      });
    }
  }

  const efficiency = values.nameplateEfficiencyPct as number | undefined;
  const ratedPowerKw = values.ratedPowerKw as number | undefined;
  if (efficiency !== undefined && ratedPowerKw !== undefined && values.poles !== undefined) {
    try {
      const ie1 = iecClassEfficiency(ratedPowerKw, values.poles as Poles, frequencyHz, 'IE1');
      if (efficiency < ie1.efficiencyPct) {
        warnings.push({
          row: parsed.row,
          field: 'nameplateEfficiencyPct',
          value: rawText('nameplateEfficiencyPct'),
          message: `${efficiency} % is below the IE1 minimum of ${ie1.efficiencyPct} % for ${ratedPowerKw} kW, ${values.poles as number} poles, ${frequencyHz} Hz (IEC 60034-30-1)`,
        });
      }
    } catch {
      // Outside the standard's range: nothing to compare against.
    }
  }

  const profile = values.dutyProfile as Array<{ hours: number }> | undefined;
  const hoursPerYear = values.hoursPerYear as number | undefined;
  if (profile && hoursPerYear !== undefined) {
    const sum = profile.reduce((total, bin) => total + bin.hours, 0);
    if (Math.abs(sum - hoursPerYear) > 1) {
      warnings.push({ row: parsed.row, field: 'dutyProfile', value: rawText('dutyProfile'), message: `bins add up to ${sum} h but hours per year is ${hoursPerYear} h` });
    }
  }
  const year = values.yearInstalled as number | undefined;
  if (year !== undefined && year > context.currentYear) {
    warnings.push({ row: parsed.row, field: 'yearInstalled', value: rawText('yearInstalled'), message: `${year} is in the future` });
  }
  return { row: parsed.row, cells: parsed.cells, values, errors, warnings, valid: errors.length === 0, action: 'skip', motorId: null };
}

/** Field labels for messages and the template. */
export const FIELD_LABELS = new Map(IMPORT_FIELD_INFO.map((info) => [info.field, info.label]));
