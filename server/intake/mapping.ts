/**
 * Columns → motor fields: the header row is found below any title rows, each header is suggested a
 * field from its usual spellings (or from the organisation's remembered mapping), and a unit written
 * in a header ("Power (hp)", "Voltage [kV]") becomes the unit of the column's bare numbers.
 */
import { IMPORT_FIELD_INFO, type ImportField, type ImportMapping } from '../shared/intake.js';
import { canonicalUnit, words, type CellValue } from './cells.js';

/** Usual header spellings per field, compared as lower-case words with units removed. */
const HEADER_SPELLINGS: Record<ImportField, string[]> = {
  tag: ['tag', 'motor tag', 'tag no', 'tag number', 'tag nr', 'equipment tag', 'asset tag', 'asset', 'asset id', 'asset no', 'motor id', 'motor no', 'equipment id', 'equipment no', 'id', 'item', 'kks', 'plant id'],
  description: ['description', 'desc', 'motor description', 'name', 'service', 'duty', 'equipment', 'equipment description', 'driven equipment name'],
  area: ['area', 'line', 'area line', 'area/line', 'location', 'plant area', 'section', 'process area', 'zone', 'department', 'building'],
  application: ['application', 'load type', 'driven equipment', 'driven load', 'type of load', 'equipment type', 'type', 'machine type'],
  ratedPowerKw: ['rated power', 'power', 'kw', 'hp', 'output', 'rated output', 'motor power', 'nameplate power', 'power rating', 'rating', 'p', 'pn', 'motor kw', 'motor hp', 'size'],
  speedRpm: ['speed', 'rpm', 'rated speed', 'n', 'nominal speed', 'motor speed', 'r/min', 'nn'],
  poles: ['poles', 'pole', 'no of poles', 'number of poles', 'pole count', 'nr of poles'],
  voltageV: ['voltage', 'volts', 'v', 'rated voltage', 'supply voltage', 'un', 'kv'],
  frequencyHz: ['frequency', 'freq', 'hz', 'rated frequency'],
  ratedCurrentA: ['current', 'amps', 'a', 'rated current', 'fla', 'full load current', 'full load amps', 'flc', 'in', 'amperage'],
  efficiencyClass: ['efficiency class', 'eff class', 'ie class', 'class', 'ie', 'energy class', 'efficiency rating', 'ie rating'],
  nameplateEfficiencyPct: ['efficiency', 'eff', 'nameplate efficiency', 'eta', 'η', 'full load efficiency', 'rated efficiency', 'efficiency %'],
  powerFactor: ['power factor', 'pf', 'cos phi', 'cosphi', 'cos φ', 'cos', 'cos ϕ'],
  frame: ['frame', 'frame size', 'motor frame'],
  enclosure: ['enclosure', 'ip', 'protection', 'ip rating', 'ip class', 'enclosure type'],
  manufacturer: ['manufacturer', 'make', 'maker', 'brand', 'vendor', 'oem', 'mfr', 'supplier'],
  yearInstalled: ['year installed', 'year', 'installed', 'installation year', 'year of installation', 'commissioned', 'year commissioned', 'install year'],
  rewinds: ['rewinds', 'rewound', 'number of rewinds', 'times rewound', 'no of rewinds'],
  controlMethod: ['control method', 'control', 'starter', 'starting method', 'drive', 'flow control', 'control type', 'start method', 'starter type', 'speed control'],
  hoursPerYear: ['hours per year', 'hours yr', 'hours year', 'hours', 'operating hours', 'run hours', 'annual hours', 'h yr', 'hrs yr', 'running hours', 'hours a', 'h a', 'op hours'],
  loadFactor: ['load factor', 'load', 'avg load', 'average load', 'loading', 'load %'],
  dutyProfile: ['duty profile', 'load profile', 'duty cycle'],
  status: ['status', 'state', 'condition', 'motor status'],
  notes: ['notes', 'remarks', 'comments', 'note', 'comment', 'remark'],
};

/** Lower-case words of a header without its unit: "Power (kW)" → "power", "Hours/yr" → "hours yr". */
export function headerKey(header: string): string {
  return words(header.replace(/\(([^)]*)\)|\[([^\]]*)\]/g, ' ')).slice(0, 200);
}

const spellingIndex = new Map<string, ImportField>();
for (const [field, spellings] of Object.entries(HEADER_SPELLINGS) as Array<[ImportField, string[]]>) {
  for (const spelling of spellings) if (!spellingIndex.has(words(spelling))) spellingIndex.set(words(spelling), field);
}

/** The unit written in a header: "(hp)", "[kV]", "… kW", "Hours/yr" → canonical unit, else undefined. */
export function headerUnit(header: string): string | undefined {
  const bracketed = /\(([^)]*)\)|\[([^\]]*)\]/.exec(header);
  if (bracketed) {
    const unit = canonicalUnit(bracketed[1] ?? bracketed[2] ?? '');
    if (unit) return unit;
  }
  const trimmed = header.trim();
  const hours = /(h|hrs?|hours)\s*\/\s*(yr|y|a|year|week|wk|day|d)\s*$/i.exec(trimmed);
  if (hours) return canonicalUnit(`h/${hours[2] ?? 'yr'}`);
  const last = /([^\s]+)\s*$/.exec(trimmed)?.[1] ?? '';
  return canonicalUnit(last) ?? (/%$/.test(trimmed) ? '%' : undefined);
}

/** The field a header most likely means, from its spelling, then from its unit alone. */
export function suggestField(header: string): ImportField | undefined {
  const key = headerKey(header);
  const found = spellingIndex.get(key) ?? spellingIndex.get(words(header));
  if (found) return found;
  const unit = headerUnit(header);
  if (unit === 'kW' || unit === 'hp' || unit === 'W' || unit === 'PS') return 'ratedPowerKw';
  if (unit === 'rpm') return 'speedRpm';
  if (unit === 'V' || unit === 'kV') return 'voltageV';
  if (unit === 'A') return 'ratedCurrentA';
  if (unit === 'Hz') return 'frequencyHz';
  if (unit === 'h/yr') return 'hoursPerYear';
  return undefined;
}

/**
 * The mapping to use: an explicit one from the user wins; otherwise the organisation's remembered
 * choice for the header, then the suggestion. A field is taken by one column only (the first).
 */
export function buildMapping(headers: string[], remembered: Map<string, string | null>, explicit?: ImportMapping): ImportMapping {
  const mapping: ImportMapping = {};
  const taken = new Set<string>();
  const known = new Set<string>(IMPORT_FIELD_INFO.map((info) => info.field));
  for (const header of headers) {
    let field: ImportField | null | undefined;
    if (explicit) field = explicit[header] ?? null;
    else {
      const key = headerKey(header);
      if (remembered.has(key)) {
        const value = remembered.get(key) ?? null;
        field = value !== null && known.has(value) ? (value as ImportField) : null;
      } else field = suggestField(header) ?? null;
    }
    if (field && taken.has(field)) field = null;
    if (field) taken.add(field);
    mapping[header] = field ?? null;
  }
  return mapping;
}

/**
 * Unique header names: blank headers become "Column C", a repeated header gets " (2)", " (3)"...
 */
export function headerNames(cells: CellValue[]): string[] {
  const seen = new Map<string, number>();
  return cells.map((cell, index) => {
    let name = cell === null ? '' : String(cell).replace(/\s+/g, ' ').trim().slice(0, 150);
    if (name === '') name = `Column ${columnLetter(index)}`;
    const count = (seen.get(name.toLowerCase()) ?? 0) + 1;
    seen.set(name.toLowerCase(), count);
    return count === 1 ? name : `${name} (${count})`;
  });
}

export function columnLetter(index: number): string {
  let letters = '';
  for (let n = index + 1; n > 0; n = Math.floor((n - 1) / 26)) letters = String.fromCharCode(65 + ((n - 1) % 26)) + letters;
  return letters;
}

/** How many rows from the top the header row is looked for in. */
export const HEADER_SEARCH_ROWS = 30;

/**
 * Index (into `rows`) of the header row: among the first HEADER_SEARCH_ROWS non-blank rows, the one
 * with the most cells that name a known field (at least two); failing that, the first row with two or
 * more text cells and no number — a title row ("Motor list, dairy plant") has one cell.
 */
export function findHeaderRow(rows: CellValue[][]): number {
  let best = -1;
  let bestScore = 1;
  const limit = Math.min(rows.length, HEADER_SEARCH_ROWS);
  for (let index = 0; index < limit; index += 1) {
    const cells = rows[index] ?? [];
    const score = cells.filter((cell) => typeof cell === 'string' && suggestField(cell) !== undefined).length;
    if (score > bestScore) {
      best = index;
      bestScore = score;
    }
  }
  if (best >= 0) return best;
  for (let index = 0; index < limit; index += 1) {
    const cells = (rows[index] ?? []).filter((cell) => cell !== null && String(cell).trim() !== '');
    if (cells.length >= 2 && cells.every((cell) => typeof cell === 'string')) return index;
  }
  return 0;
}
