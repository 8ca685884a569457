/**
 * The spreadsheet parser, run in a worker thread (server/intake/parse.ts starts it with a heap limit
 * and a wall-clock timeout). The npm build of xlsx has published advisories for crafted files
 * (prototype pollution, ReDoS): here a hostile file can at worst pollute this worker's own objects
 * or exhaust its own limits; the server receives only plain arrays of strings and numbers.
 *
 * A plain .xlsx (the usual motor list) is read by xlsx-fast.mjs, which gives the same cells as xlsx
 * in a fraction of the time; anything else (.xls, .csv, or an .xlsx it does not handle exactly) by xlsx.
 *
 * Plain JavaScript on purpose: a worker cannot inherit tsx's loader under Node 20 (`execArgv` with
 * `--import tsx` is refused in workers), and a .mjs file needs no loader at all, so the same file runs
 * under tsx, vitest and a compiled build, and the worker starts in milliseconds.
 *
 * In: workerData = { bytes: Uint8Array, limits: { maxRows, maxColumns, maxExpandedBytes, maxPartBytes } }.
 * Out: { ok: true, sheetName, rows: [[rowNumber, cells[]], ...], sheetRows } or { ok: false, code, message }.
 */
import { parentPort, workerData } from 'node:worker_threads';
import { PartTooLargeError, readPlainXlsx, xlsxReadOptions, zipDirectory } from './xlsx-fast.mjs';

/** xlsx, loaded only when a file needs it (loading it takes 0.4 s; a plain .xlsx does not). */
let XLSX;

/** A part of the workbook in the user's words. */
function partWords(name) {
  return /sharedStrings/i.test(name) ? 'its shared-strings table' : name || 'its contents';
}

function refuse(code, message) {
  parentPort.postMessage({ ok: false, code, message });
}

/** The first sheet through xlsx: { sheetName, ref, fullref, table() }. What xlsx throws, run's caller words for the user. */
async function readWithXlsx(bytes, sheetRows) {
  XLSX ??= await import('xlsx');
  const workbook = XLSX.read(bytes, xlsxReadOptions(sheetRows));
  const sheetName = workbook.SheetNames[0];
  const sheet = sheetName === undefined ? undefined : workbook.Sheets[sheetName];
  if (!sheet || !sheet['!ref']) return { sheetName, ref: undefined, fullref: undefined, table: () => [] };
  return {
    sheetName,
    ref: XLSX.utils.decode_range(sheet['!ref']),
    fullref: XLSX.utils.decode_range(sheet['!fullref'] || sheet['!ref']),
    table: () => XLSX.utils.sheet_to_json(sheet, { header: 1, raw: true, defval: null, blankrows: true }),
  };
}

async function run() {
  const { bytes, limits, kind } = workerData;
  if (kind === 'zip') {
    const entries = zipDirectory(bytes)?.entries;
    if (!entries) return refuse('unreadable', 'The file looks like an .xlsx (ZIP) but its directory cannot be read.');
    const total = entries.reduce((sum, entry) => sum + entry.size, 0);
    const largest = entries.reduce((big, entry) => (entry.size > big.size ? entry : big), { name: '', size: 0 });
    if (total > limits.maxExpandedBytes || largest.size > limits.maxPartBytes) {
      const what = partWords(largest.name);
      return refuse(
        'too-large',
        `The workbook expands to ${Math.round(total / 1048576)} MB (${what}: ${Math.round(largest.size / 1048576)} MB); at most ${Math.round(limits.maxPartBytes / 1048576)} MB per part can be imported. Save only the motor list, or split it.`,
      );
    }
  }
  const sheetRowsLimit = limits.maxRows + limits.headerRows + 1;
  let sheet;
  if (kind === 'zip') {
    try {
      sheet = readPlainXlsx(bytes, { sheetRows: sheetRowsLimit, maxPartBytes: limits.maxPartBytes });
    } catch (error) {
      if (error instanceof PartTooLargeError) {
        const limit = Math.round(limits.maxPartBytes / 1048576);
        return refuse('too-large', `The workbook expands to more than its ZIP directory declares (${partWords(error.part)}: over ${limit} MB); at most ${limit} MB per part can be imported. Save only the motor list, or split it.`);
      }
      sheet = undefined; // xlsx reads it below, and says what is wrong with it
    }
  }
  if (!sheet) sheet = await readWithXlsx(bytes, sheetRowsLimit);
  const { sheetName, ref: range, fullref: full } = sheet;
  if (!range) return refuse('empty', 'The first sheet of the file is empty.');
  const sheetRows = full.e.r - full.s.r + 1;
  if (sheetRows > limits.maxRows + limits.headerRows) {
    return refuse('too-many-rows', `The sheet has ${sheetRows} rows; at most ${limits.maxRows} data rows can be imported at once. Split the file.`);
  }
  if (range.e.c - range.s.c + 1 > limits.maxColumns) {
    return refuse('too-many-columns', `The sheet has ${range.e.c - range.s.c + 1} columns; at most ${limits.maxColumns} can be imported.`);
  }
  const table = sheet.table();
  const rows = [];
  for (let index = 0; index < table.length; index += 1) {
    const source = table[index];
    if (!Array.isArray(source)) continue;
    const cells = [];
    let filled = false;
    for (let column = 0; column < source.length && column < limits.maxColumns; column += 1) {
      const value = source[column];
      let cell = null;
      if (typeof value === 'number') cell = Number.isFinite(value) ? value : null;
      else if (typeof value === 'string') cell = value.length > 2000 ? value.slice(0, 2000) : value;
      else if (typeof value === 'boolean') cell = value ? 'TRUE' : 'FALSE';
      else if (value instanceof Date) cell = value.toISOString();
      if (typeof cell === 'string' && cell.trim() === '') cell = null;
      if (cell !== null) filled = true;
      cells.push(cell);
    }
    if (filled) rows.push([range.s.r + index + 1, cells]);
  }
  parentPort.postMessage({ ok: true, sheetName: String(sheetName).slice(0, 100), rows, sheetRows });
}

run().catch((error) => {
  refuse('unreadable', `The file cannot be read as a spreadsheet (${String(error && error.message ? error.message : error).slice(0, 200)}).`);
});
