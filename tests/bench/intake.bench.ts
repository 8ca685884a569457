/**
 * `npm run bench -- intake`: a 50,000-row import — parse (worker thread) + validate + staging rows,
 * then the commit in one transaction — on a throwaway PostgreSQL cluster. Goal (issue 6): under 15 s
 * in total. Then a re-import of the same file (50,000 updates by tag) and its undo.
 * `BENCH_ROWS=n` changes the count.
 */
import { cpus, loadavg } from 'node:os';
import * as XLSX from 'xlsx';
import { commitImport, createImport, undoImport } from '../../server/intake/service.js';
import { IMPORT_FIELD_INFO } from '../../server/shared/intake.js';
import { benchDatabase } from './bench-database.js';

const ROWS = Number(process.env.BENCH_ROWS ?? 50_000);
const GOAL_SECONDS = 15;
const RATINGS = ['0,37 kW', '0.75 kW', 1.5, 3, '5,5 kW', 7.5, '15 hp', 15, 22, '37 kW', 55, 75, 110, 160];
const APPLICATIONS = ['fan', 'pump', 'compressor', 'conveyor', 'mixer', 'Cooling tower fan'];
const CONTROLS = ['DOL', 'VFD', 'throttling valve', 'outlet damper', 'star-delta'];

function workbook(rows: number, powerScale: number): Buffer {
  const header = IMPORT_FIELD_INFO.map((info) => info.label);
  const data: Array<Array<string | number | null>> = [['Motor list (generated for the benchmark)'], header];
  for (let index = 0; index < rows; index += 1) {
    const values: Record<string, string | number | null> = {
      tag: `B-${String(index).padStart(6, '0')}`,
      description: `Motor ${index} of line ${index % 40}`,
      area: `Area ${index % 25}`,
      application: APPLICATIONS[index % APPLICATIONS.length] ?? 'other',
      ratedPowerKw: typeof RATINGS[index % RATINGS.length] === 'number' ? (RATINGS[index % RATINGS.length] as number) * powerScale : (RATINGS[index % RATINGS.length] as string),
      speedRpm: index % 3 === 0 ? '1460 rpm' : 2950,
      poles: index % 3 === 0 ? 4 : 2,
      voltageV: index % 2 === 0 ? '400 V' : 400,
      frequencyHz: 50,
      ratedCurrentA: '14,2',
      efficiencyClass: index % 4 === 0 ? 'IE 2' : 'ie3',
      nameplateEfficiencyPct: '91,5 %',
      powerFactor: 0.84,
      frame: '132M',
      enclosure: 'IP55',
      manufacturer: 'Example Motorworks',
      yearInstalled: 2000 + (index % 24),
      rewinds: index % 3,
      controlMethod: CONTROLS[index % CONTROLS.length] ?? 'DOL',
      hoursPerYear: '6000 h/yr',
      loadFactor: '75 %',
      dutyProfile: index % 10 === 0 ? '0.5:2000; 0.8:4000' : null,
      status: 'in service',
      notes: null,
    };
    data.push(IMPORT_FIELD_INFO.map((info) => values[info.field] ?? null));
  }
  const book = XLSX.utils.book_new();
  XLSX.utils.book_append_sheet(book, XLSX.utils.aoa_to_sheet(data), 'Motors');
  return XLSX.write(book, { type: 'buffer', bookType: 'xlsx', compression: true }) as Buffer;
}

const seconds = (from: bigint) => Number(process.hrtime.bigint() - from) / 1e9;

async function main() {
  const db = await benchDatabase();
  try {
    const file = workbook(ROWS, 1);
    process.stdout.write(`generated ${ROWS} rows × ${IMPORT_FIELD_INFO.length} columns: ${(file.length / 1048576).toFixed(1)} MB .xlsx\n`);

    const cpuBefore = process.cpuUsage();
    let start = process.hrtime.bigint();
    const preview = await createImport(db.tenant, { buffer: file, originalname: 'bench.xlsx' }, { siteId: db.site.id });
    const previewSeconds = seconds(start);
    start = process.hrtime.bigint();
    const committed = await commitImport(db.tenant, preview.id);
    const commitSeconds = seconds(start);
    const total = previewSeconds + commitSeconds;
    const cpu = process.cpuUsage(cpuBefore);
    process.stdout.write(`load average at start ${loadavg()[0]?.toFixed(1)} on ${cpus().length} cores; this process's CPU (main thread + worker) ${((cpu.user + cpu.system) / 1e6).toFixed(2)} s\n`);
    process.stdout.write(
      `first import: upload→preview (parse + validate + staging) ${previewSeconds.toFixed(2)} s, commit ${commitSeconds.toFixed(2)} s ` +
        `(created ${committed.created}, rows valid ${preview.rows.valid}/${preview.rows.total}); total ${total.toFixed(2)} s — goal < ${GOAL_SECONDS} s: ${total < GOAL_SECONDS ? 'met' : 'NOT met'}\n`,
    );

    const again = workbook(ROWS, 1.5);
    start = process.hrtime.bigint();
    const preview2 = await createImport(db.tenant, { buffer: again, originalname: 'bench-2.xlsx' }, { siteId: db.site.id });
    const preview2Seconds = seconds(start);
    start = process.hrtime.bigint();
    const committed2 = await commitImport(db.tenant, preview2.id);
    const commit2Seconds = seconds(start);
    process.stdout.write(`re-import (updates by tag): preview ${preview2Seconds.toFixed(2)} s, commit ${commit2Seconds.toFixed(2)} s (updated ${committed2.updated})\n`);
    start = process.hrtime.bigint();
    const undone = await undoImport(db.tenant, preview2.id);
    process.stdout.write(`undo of the re-import: ${seconds(start).toFixed(2)} s (restored ${undone.restored})\n`);
    process.stdout.write(`peak RSS ${(process.memoryUsage().rss / 1048576).toFixed(0)} MB\n`);
  } finally {
    await db.close();
  }
}

main().catch((error: unknown) => {
  process.stderr.write(`${error instanceof Error ? (error.stack ?? error.message) : String(error)}\n`);
  process.exit(1);
});
