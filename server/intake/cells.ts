/**
 * Reading one spreadsheet cell as a value of a motor field: numbers with units ("7,5 kW", "10 hp",
 * "0.4 kV", "1 460 rpm", "91.2 %", "6000 h/yr"), a bare number in the column's unit, and the human
 * spellings of the codes ("DOL", "VFD", "IE 3"...). Unit conversion uses mathjs units (a private
 * instance with `rpm` and metric horsepower added); each conversion factor is computed once.
 */
import { all, create, type FactoryFunctionMap } from 'mathjs';

const math = create(all as FactoryFunctionMap);
// rpm as a rotational frequency, so mathjs can convert r/min and 1/min alike.
math.createUnit('rpm', '0.016666666666666666 Hz');
// Metric horsepower (PS, CV), still on older European nameplates: 735.49875 W (DIN 66036).
math.createUnit('PS', '735.49875 W');

export type CellValue = string | number | null;

/** Result of reading a cell: a value, nothing (blank), or the reason it cannot be read. */
export type CellResult<T> = { ok: true; value: T | null; note?: string } | { ok: false; message: string };

const blank = <T>(): CellResult<T> => ({ ok: true, value: null });
const fail = <T>(message: string): CellResult<T> => ({ ok: false, message });

/** Spellings of units in cells and headers → mathjs unit names (lower-cased keys). */
const UNIT_ALIASES: Record<string, string> = {
  w: 'W',
  kw: 'kW',
  mw: 'MW',
  hp: 'hp',
  bhp: 'hp',
  ps: 'PS',
  cv: 'PS',
  pk: 'PS',
  rpm: 'rpm',
  'r/min': 'rpm',
  '1/min': 'rpm',
  'min-1': 'rpm',
  'min^-1': 'rpm',
  'min⁻¹': 'rpm',
  'u/min': 'rpm',
  v: 'V',
  kv: 'kV',
  a: 'A',
  amp: 'A',
  amps: 'A',
  ma: 'mA',
  hz: 'Hz',
  '%': '%',
  pct: '%',
  percent: '%',
};

/** Hours of running per period → per year. A 168 h week and a 24 h day are a full 8760 h year. */
const HOURS_PER_YEAR_FACTORS: Record<string, number> = {
  'h/yr': 1,
  'h/y': 1,
  'h/a': 1,
  'h/year': 1,
  'hrs/yr': 1,
  'hr/yr': 1,
  'hours/year': 1,
  'hours/yr': 1,
  'h/week': 8760 / 168,
  'h/wk': 8760 / 168,
  'hrs/week': 8760 / 168,
  'hours/week': 8760 / 168,
  'h/day': 365,
  'h/d': 365,
  'hrs/day': 365,
  'hours/day': 365,
};

/** Canonical unit of a unit spelling, or undefined when Statorline does not know it. */
export function canonicalUnit(text: string): string | undefined {
  const key = text.trim().toLowerCase().replace(/\s+/g, '').replace(/^\[|\]$/g, '');
  if (key === '') return undefined;
  if (key in HOURS_PER_YEAR_FACTORS) return key === 'h/yr' ? 'h/yr' : key;
  return UNIT_ALIASES[key];
}

const factorCache = new Map<string, number>();

/** Factor that converts a value in `from` to `to` (both canonical), from mathjs units; undefined if incompatible. */
export function conversionFactor(from: string, to: string): number | undefined {
  if (from === to) return 1;
  const key = `${from}>${to}`;
  const cached = factorCache.get(key);
  if (cached !== undefined || factorCache.has(key)) return cached;
  let factor: number | undefined;
  if (from in HOURS_PER_YEAR_FACTORS && to === 'h/yr') factor = HOURS_PER_YEAR_FACTORS[from];
  else if (from === '%' || to === '%' || from in HOURS_PER_YEAR_FACTORS || to in HOURS_PER_YEAR_FACTORS) factor = undefined;
  else {
    try {
      factor = math.unit(1, from).toNumber(to);
    } catch {
      factor = undefined;
    }
  }
  factorCache.set(key, factor as number);
  return factor;
}

/**
 * A number written by a person: decimal point or comma, spaces or apostrophes as thousands
 * separators. With both '.' and ',' the last one is the decimal mark; a lone ',' is a decimal comma
 * unless it groups thousands more than once ("1,234,567").
 */
export function parseLocaleNumber(text: string): number | undefined {
  let s = text.trim().replace(/[\s\u00a0\u202f']/g, '').replace(/^\u2212/, '-');
  if (!/^[+-]?(\d|[.,]\d)[\d.,]*$/.test(s)) return undefined;
  const lastDot = s.lastIndexOf('.');
  const lastComma = s.lastIndexOf(',');
  if (lastDot >= 0 && lastComma >= 0) {
    const decimal = lastDot > lastComma ? '.' : ',';
    const thousands = decimal === '.' ? ',' : '.';
    s = s.split(thousands).join('');
    if (decimal === ',') s = s.replace(',', '.');
  } else if (lastComma >= 0) {
    s = /^[+-]?\d{1,3}(,\d{3}){2,}$/.test(s) ? s.split(',').join('') : s.replace(',', '.');
    if ((s.match(/\./g) ?? []).length > 1) return undefined;
  } else if ((s.match(/\./g) ?? []).length > 1) {
    if (!/^[+-]?\d{1,3}(\.\d{3}){2,}$/.test(s)) return undefined;
    s = s.split('.').join('');
  }
  const value = Number(s);
  return Number.isFinite(value) ? value : undefined;
}

/** Splits "7,5 kW" into the number and the unit text. */
function splitQuantity(text: string): { number: number; unit: string } | undefined {
  const match = /^\s*([+\-\u2212]?[\d\s\u00a0\u202f.,']*\d|[+\-\u2212]?[.,]\d+)\s*(.*?)\s*$/.exec(text);
  if (!match) return undefined;
  const number = parseLocaleNumber(match[1] ?? '');
  if (number === undefined) return undefined;
  return { number, unit: match[2] ?? '' };
}

export interface QuantityOptions {
  /** Unit the field is stored in (canonical). */
  target: string;
  /** Unit of a bare number: the column's (from its header) or the field's own. */
  columnUnit: string;
  /** Shown in messages, e.g. "kW or hp". */
  accepted: string;
}

/** A physical quantity in the field's unit. */
export function parseQuantity(cell: CellValue, options: QuantityOptions): CellResult<number> {
  if (cell === null) return blank();
  let number: number;
  let unit: string;
  if (typeof cell === 'number') {
    number = cell;
    unit = options.columnUnit;
  } else {
    const text = cell.trim();
    if (text === '' || isUnknownWord(text)) return blank();
    const quantity = splitQuantity(text);
    if (!quantity) return fail(`is not a number${options.accepted ? ` (expected ${options.accepted})` : ''}`);
    number = quantity.number;
    if (quantity.unit === '') unit = options.columnUnit;
    else {
      const canonical = canonicalUnit(quantity.unit);
      if (canonical === undefined) return fail(`has a unit Statorline does not know: "${quantity.unit}" (expected ${options.accepted})`);
      unit = canonical;
    }
  }
  if (!Number.isFinite(number)) return fail('is not a number');
  const factor = conversionFactor(unit, options.target);
  if (factor === undefined) return fail(`is in ${unit}, which cannot be converted to ${options.target} (expected ${options.accepted})`);
  return { ok: true, value: roundSignificant(number * factor) };
}

/** Drops floating-point noise from conversions (10 hp → 7.456998715 kW, not …385999). */
function roundSignificant(value: number): number {
  return value === 0 ? 0 : Number(value.toPrecision(10));
}

/**
 * A fraction (power factor, load factor): "0,85", 0.85, "85 %" → 0.85. A bare number above
 * `fractionMax` is not silently read as a percentage: that is an error the user sees.
 */
export function parseFraction(cell: CellValue, columnIsPercent: boolean): CellResult<number> {
  if (cell === null) return blank();
  let number: number;
  let percent = columnIsPercent;
  if (typeof cell === 'number') number = cell;
  else {
    const text = cell.trim();
    if (text === '' || isUnknownWord(text)) return blank();
    const quantity = splitQuantity(text);
    if (!quantity) return fail('is not a number');
    if (quantity.unit !== '') {
      if (canonicalUnit(quantity.unit) !== '%') return fail(`has a unit that does not fit: "${quantity.unit}" (expected a fraction such as 0.85 or a percentage)`);
      percent = true;
    }
    number = quantity.number;
  }
  return { ok: true, value: percent ? roundSignificant(number / 100) : number };
}

/** An efficiency in %: "91,2 %", 91.2, or a fraction 0.912 (a cell formatted as a percentage holds that). */
export function parsePercent(cell: CellValue): CellResult<number> {
  if (cell === null) return blank();
  let number: number;
  let explicitPercent = false;
  if (typeof cell === 'number') number = cell;
  else {
    const text = cell.trim();
    if (text === '' || isUnknownWord(text)) return blank();
    const quantity = splitQuantity(text);
    if (!quantity) return fail('is not a number (expected a percentage such as 91.2 %)');
    if (quantity.unit !== '' && canonicalUnit(quantity.unit) !== '%') return fail(`has a unit that does not fit: "${quantity.unit}" (expected %)`);
    explicitPercent = quantity.unit !== '';
    number = quantity.number;
  }
  if (!explicitPercent && number > 0 && number <= 1) return { ok: true, value: roundSignificant(number * 100), note: `${number} read as ${roundSignificant(number * 100)} %` };
  return { ok: true, value: number };
}

/** A whole number (year, rewinds). */
export function parseInteger(cell: CellValue): CellResult<number> {
  if (cell === null) return blank();
  if (typeof cell === 'number') return { ok: true, value: cell };
  const text = cell.trim();
  if (text === '' || isUnknownWord(text)) return blank();
  const number = parseLocaleNumber(text);
  return number === undefined ? fail('is not a whole number') : { ok: true, value: number };
}

/** Poles: 4, "4", "4p", "4 pole", "4-pole", "4 poles". */
export function parsePoles(cell: CellValue): CellResult<number> {
  if (cell === null) return blank();
  if (typeof cell === 'number') return { ok: true, value: cell };
  const text = cell.trim().toLowerCase();
  if (text === '' || isUnknownWord(text)) return blank();
  const match = /^(\d+)\s*-?\s*(p|pole|poles|pol|polig)?$/.exec(text);
  return match ? { ok: true, value: Number(match[1]) } : fail('must be 2, 4, 6 or 8');
}

/** Plain text, trimmed; numbers become their text ("101" for a numeric tag). */
export function parseText(cell: CellValue): CellResult<string> {
  if (cell === null) return blank();
  const text = (typeof cell === 'number' ? String(cell) : cell).replace(/\s+/g, ' ').trim();
  return text === '' ? blank() : { ok: true, value: text };
}

const UNKNOWN_WORDS = new Set(['-', '–', '—', '?', 'n/a', 'na', 'n.a.', 'unknown', 'unk', 'none', 'nil', 'tbd', 'tbc', '?']);
function isUnknownWord(text: string): boolean {
  return UNKNOWN_WORDS.has(text.trim().toLowerCase());
}

/** Lower-case words only: "Direct-On-Line" and "direct on line" compare equal. */
export function words(text: string): string {
  return text
    .toLowerCase()
    .replace(/[._/\\()[\]{}:;,'"-]+/g, ' ')
    .replace(/\s+/g, ' ')
    .trim();
}

/** A code from a spelling list: exact words first, then the first keyword the text contains. */
function codeFrom<T extends string>(cell: CellValue, exact: Record<string, T>, keywords: Array<[RegExp, T]>, expected: string): CellResult<T> {
  if (cell === null) return blank();
  const text = words(String(cell));
  if (text === '') return blank();
  const found = exact[text] ?? exact[text.replace(/\s/g, '')] ?? keywords.find(([pattern]) => pattern.test(text))?.[1];
  return found === undefined ? fail(`is not one of ${expected}`) : { ok: true, value: found };
}

export function parseApplication(cell: CellValue) {
  return codeFrom(
    cell,
    { fan: 'fan', pump: 'pump', compressor: 'compressor', conveyor: 'conveyor', mixer: 'mixer', other: 'other' },
    [
      [/\b(fan|fans|blower|ventilat\w*|exhaust|extract\w*|cooling tower)\b/, 'fan'],
      [/\b(pump|pumps|pumping)\b/, 'pump'],
      [/\b(compressor|compressors|compressed air|refrigeration|chiller)\b/, 'compressor'],
      [/\b(conveyor|conveyors|belt|elevator|screw|auger)\b/, 'conveyor'],
      [/\b(mixer|mixers|agitator|stirrer|blender)\b/, 'mixer'],
      [/\b(misc|miscellaneous|general|crusher|mill|other|unknown)\b/, 'other'],
    ],
    'fan, pump, compressor, conveyor, mixer, other',
  );
}

export function parseControlMethod(cell: CellValue) {
  return codeFrom(
    cell,
    {
      dol: 'direct-on-line',
      'direct on line': 'direct-on-line',
      'across the line': 'direct-on-line',
      'star delta': 'direct-on-line',
      'soft starter': 'direct-on-line',
      'soft start': 'direct-on-line',
      'fixed speed': 'direct-on-line',
      'throttle valve': 'throttle-valve',
      'throttling valve': 'throttle-valve',
      throttle: 'throttle-valve',
      throttling: 'throttle-valve',
      valve: 'throttle-valve',
      'outlet damper': 'outlet-damper',
      damper: 'outlet-damper',
      'inlet vanes': 'inlet-vanes',
      'inlet guide vanes': 'inlet-vanes',
      igv: 'inlet-vanes',
      vanes: 'inlet-vanes',
      vfd: 'variable-speed-drive',
      vsd: 'variable-speed-drive',
      asd: 'variable-speed-drive',
      inverter: 'variable-speed-drive',
      'variable speed drive': 'variable-speed-drive',
      'variable frequency drive': 'variable-speed-drive',
      'adjustable speed drive': 'variable-speed-drive',
      'frequency converter': 'variable-speed-drive',
    },
    [
      [/\b(vfd|vsd|inverter|variable speed|variable frequency|frequency converter)\b/, 'variable-speed-drive'],
      [/\b(throttl\w*|valve)\b/, 'throttle-valve'],
      [/\bdamper\b/, 'outlet-damper'],
      [/\bvanes?\b/, 'inlet-vanes'],
      [/\b(dol|direct|star|wye|soft|starter|contactor)\b/, 'direct-on-line'],
    ],
    'DOL, throttling valve, outlet damper, inlet vanes, VSD',
  );
}

/**
 * Efficiency class: "IE3", "ie 3", "IE-3"; "unknown", "-" → unknown. The old CEMEP classes map to the
 * IEC class they correspond to — EFF1 → IE2, EFF2 → IE1, EFF3 (below IE1) → unknown — with a note.
 * "NEMA Premium" → IE3, "EPAct" / "high efficiency" → IE2 (the levels IEC 60034-30-1 adopts at 60 Hz).
 */
export function parseEfficiencyClass(cell: CellValue): CellResult<'IE1' | 'IE2' | 'IE3' | 'IE4' | 'IE5' | 'unknown'> {
  if (cell === null) return blank();
  const raw = String(cell).trim();
  if (raw === '' || isUnknownWord(raw)) return { ok: true, value: 'unknown' };
  const text = words(raw).replace(/\s/g, '');
  const ie = /^ie([1-5])$/.exec(text);
  if (ie) return { ok: true, value: `IE${ie[1]}` as 'IE1' };
  if (/^[1-5]$/.test(text)) return { ok: true, value: `IE${text}` as 'IE1' };
  const eff = /^eff([1-3])$/.exec(text);
  if (eff) {
    const value = eff[1] === '1' ? 'IE2' : eff[1] === '2' ? 'IE1' : 'unknown';
    return { ok: true, value, note: `${raw} read as ${value} (the old CEMEP class ${raw.toUpperCase()} corresponds to ${eff[1] === '3' ? 'less than IE1' : value})` };
  }
  if (/nemapremium|premium/.test(text)) return { ok: true, value: 'IE3', note: `${raw} read as IE3` };
  if (/epact|highefficiency|energyefficient/.test(text)) return { ok: true, value: 'IE2', note: `${raw} read as IE2` };
  if (/standard/.test(text)) return { ok: true, value: 'IE1', note: `${raw} read as IE1` };
  return fail('is not one of IE1, IE2, IE3, IE4, IE5, unknown');
}

export function parseStatus(cell: CellValue) {
  return codeFrom(
    cell,
    {
      'in service': 'in-service',
      inservice: 'in-service',
      running: 'in-service',
      active: 'in-service',
      operating: 'in-service',
      operational: 'in-service',
      standby: 'standby',
      spare: 'standby',
      'stand by': 'standby',
      'out of service': 'out-of-service',
      oos: 'out-of-service',
      'not running': 'out-of-service',
      off: 'out-of-service',
      idle: 'out-of-service',
      retired: 'retired',
      scrapped: 'retired',
      decommissioned: 'retired',
      removed: 'retired',
    },
    [],
    'in service, standby, out of service, retired',
  );
}

/** A duty profile "0.5:2000; 0.8:3000" (fraction or % : hours) → bins. */
export function parseDutyProfile(cell: CellValue): CellResult<Array<{ fraction: number; hours: number }>> {
  if (cell === null) return blank();
  const text = String(cell).trim();
  if (text === '' || isUnknownWord(text)) return blank();
  const bins: Array<{ fraction: number; hours: number }> = [];
  for (const part of text.split(/[;|\n]/).map((p) => p.trim()).filter((p) => p !== '')) {
    const match = /^(.+?)\s*[:=@]\s*(.+)$/.exec(part);
    if (!match) return fail('must be bins as fraction:hours separated by ; (e.g. 0.5:2000; 0.8:3000)');
    const fraction = parseFraction(match[1] ?? '', false);
    const hours = parseQuantity(match[2] ?? '', { target: 'h/yr', columnUnit: 'h/yr', accepted: 'hours' });
    if (!fraction.ok || fraction.value === null || !hours.ok || hours.value === null) {
      return fail(`has a bin that cannot be read: "${part}" (expected fraction:hours, e.g. 0.5:2000)`);
    }
    bins.push({ fraction: fraction.value, hours: hours.value });
  }
  return bins.length === 0 ? blank() : { ok: true, value: bins };
}
