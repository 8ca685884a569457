/**
 * Parses an uploaded spreadsheet in a worker thread (parse-worker.mjs) with a heap limit and a
 * wall-clock timeout, then checks that what came back is only rows of strings and numbers. The file
 * type is recognised from its content: .xlsx (ZIP), .xls (OLE compound file) or text (.csv);
 * anything else is refused before xlsx sees it.
 */
import { Worker } from 'node:worker_threads';
import { AppError, badRequest, tooLarge } from '../lib/errors.js';
import { sniffType } from '../lib/uploads.js';
import { IMPORT_LIMITS } from '../shared/intake.js';
import type { CellValue } from './cells.js';
import { HEADER_SEARCH_ROWS } from './mapping.js';

export interface ParsedSheet {
  sheetName: string;
  /** Non-blank rows with their spreadsheet row numbers. */
  rows: Array<{ row: number; cells: CellValue[] }>;
}

export interface ParseLimits {
  maxRows: number;
  maxColumns: number;
  timeoutMs: number;
  heapMb: number;
  /** Sum of the declared uncompressed sizes of an .xlsx's parts [bytes]. */
  maxExpandedBytes: number;
  /** Largest single part (a sheet, the shared-strings table) [bytes]. */
  maxPartBytes: number;
}

export const DEFAULT_PARSE_LIMITS: ParseLimits = {
  maxRows: IMPORT_LIMITS.maxRows,
  maxColumns: IMPORT_LIMITS.maxColumns,
  timeoutMs: IMPORT_LIMITS.parseTimeoutMs,
  heapMb: IMPORT_LIMITS.parseHeapMb,
  maxExpandedBytes: 400 * 1024 * 1024,
  maxPartBytes: 250 * 1024 * 1024,
};

const unreadable = (message: string) => new AppError('unreadable-file', message, 400);

type WorkerAnswer =
  | { ok: true; sheetName: string; rows: Array<[number, CellValue[]]>; sheetRows: number }
  | { ok: false; code: string; message: string };

export async function parseSpreadsheet(bytes: Buffer, limits: ParseLimits = DEFAULT_PARSE_LIMITS): Promise<ParsedSheet> {
  const type = sniffType(bytes);
  if (type !== 'application/zip' && type !== 'application/x-cfb' && type !== 'text/plain') {
    throw unreadable('The file is not a spreadsheet: upload an .xlsx, .xls or .csv file.');
  }
  const kind = type === 'application/zip' ? 'zip' : type === 'application/x-cfb' ? 'cfb' : 'text';
  const answer = await runWorker(bytes, kind, limits);
  if (!answer.ok) {
    if (answer.code === 'too-large' || answer.code === 'too-many-rows' || answer.code === 'too-many-columns') throw tooLarge(answer.message);
    throw unreadable(answer.message);
  }
  const rows = plainRows(answer.rows);
  if (rows.length === 0) throw unreadable('The first sheet of the file has no rows.');
  if (rows.length > limits.maxRows + HEADER_SEARCH_ROWS) {
    throw tooLarge(`The sheet has ${rows.length} rows; at most ${limits.maxRows} data rows can be imported at once. Split the file.`);
  }
  return { sheetName: typeof answer.sheetName === 'string' ? answer.sheetName : 'Sheet1', rows };
}

/** Copies the worker's answer into fresh arrays, keeping only strings, finite numbers and nulls. */
function plainRows(source: unknown): ParsedSheet['rows'] {
  if (!Array.isArray(source)) throw unreadable('The file cannot be read as a spreadsheet.');
  const rows: ParsedSheet['rows'] = [];
  for (const entry of source as unknown[]) {
    if (!Array.isArray(entry) || typeof entry[0] !== 'number' || !Array.isArray(entry[1])) continue;
    const cells: CellValue[] = (entry[1] as unknown[]).map((cell) =>
      typeof cell === 'string' ? cell : typeof cell === 'number' && Number.isFinite(cell) ? cell : null,
    );
    rows.push({ row: entry[0], cells });
  }
  return rows;
}

function runWorker(bytes: Buffer, kind: string, limits: ParseLimits): Promise<WorkerAnswer> {
  return new Promise((resolve, reject) => {
    const copy = new Uint8Array(bytes); // its own buffer, transferred (not shared) to the worker
    const worker = new Worker(new URL('./parse-worker.mjs', import.meta.url), {
      workerData: {
        bytes: copy,
        kind,
        limits: {
          maxRows: limits.maxRows,
          maxColumns: limits.maxColumns,
          headerRows: HEADER_SEARCH_ROWS,
          maxExpandedBytes: limits.maxExpandedBytes,
          maxPartBytes: limits.maxPartBytes,
        },
      },
      transferList: [copy.buffer],
      resourceLimits: { maxOldGenerationSizeMb: limits.heapMb, maxYoungGenerationSizeMb: 64, stackSizeMb: 4 },
      stdout: true,
      stderr: true,
    });
    let settled = false;
    const finish = (action: () => void) => {
      if (settled) return;
      settled = true;
      clearTimeout(timer);
      action();
      void worker.terminate();
    };
    const timer = setTimeout(
      () => finish(() => reject(unreadable(`Reading the file took longer than ${limits.timeoutMs / 1000} s and was stopped. Save only the motor list as a plain .xlsx or .csv.`))),
      limits.timeoutMs,
    );
    worker.once('message', (message: WorkerAnswer) => finish(() => resolve(message)));
    worker.once('error', (error: Error & { code?: string }) =>
      finish(() =>
        reject(
          error.code === 'ERR_WORKER_OUT_OF_MEMORY'
            ? tooLarge(`Reading the file needed more than ${limits.heapMb} MB of memory and was stopped. Save only the motor list, or split it.`)
            : unreadable('The file cannot be read as a spreadsheet.'),
        ),
      ),
    );
    worker.once('exit', (code) => finish(() => reject(code === 0 ? unreadable('The file cannot be read as a spreadsheet.') : badRequest('Reading the file stopped unexpectedly.'))));
  });
}
