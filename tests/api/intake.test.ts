import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import * as XLSX from 'xlsx';
import { afterAll, afterEach, beforeAll, describe, expect, it } from 'vitest';
import { database } from '../../server/lib/database.js';
import { setUploadDir } from '../../server/lib/uploads.js';
import { intakeTestHooks } from '../../server/intake/service.js';
import { ImportBatch, Motor, type Organization, type Site } from '../../server/models/index.js';
import { IMPORT_FIELD_INFO } from '../../server/shared/intake.js';
import { createOrganization, createSite, createUser, signIn, startTestApp, type TestContext } from '../support/api.js';

let context: TestContext;
let organization: Organization;
let site: Site;
let session: Awaited<ReturnType<typeof signIn>>;
let uploadDir: string;

type Cell = string | number | null;

/** The 200,000-row file and the 5,000-row commit take seconds on an idle machine, much longer on a loaded one. */
const HEAVY_TEST_MS = 180_000;

function xlsxOf(rows: Cell[][], sheetName = 'Motors'): Buffer {
  const workbook = XLSX.utils.book_new();
  XLSX.utils.book_append_sheet(workbook, XLSX.utils.aoa_to_sheet(rows), sheetName);
  return XLSX.write(workbook, { type: 'buffer', bookType: 'xlsx', compression: true }) as Buffer;
}

function upload(agent: typeof session, file: Buffer, siteId: number, fileName = 'motors.xlsx', mapping?: Record<string, string | null>) {
  const request = agent.post('/api/imports').field('siteId', String(siteId));
  if (mapping) request.field('mapping', JSON.stringify(mapping));
  return request.attach('file', file, fileName);
}

/** Everything an import could have changed, for "the database is unchanged" checks. */
async function snapshot(organizationId: number) {
  const [motors] = await database().query(`SELECT * FROM motors WHERE organization_id = ${organizationId} ORDER BY id`);
  const [counts] = await database().query(
    `SELECT (SELECT count(*) FROM import_batches WHERE organization_id = ${organizationId}) AS batches,
            (SELECT count(*) FROM import_rows r JOIN import_batches b ON b.id = r.batch_id WHERE b.organization_id = ${organizationId}) AS rows,
            (SELECT count(*) FROM audit_logs WHERE organization_id = ${organizationId} AND entity = 'motor') AS audits`,
  );
  return { motors, counts };
}

const cleanHeader = IMPORT_FIELD_INFO.map((info) => info.label);
function cleanRow(index: number, powerKw = 7.5): Cell[] {
  const values: Record<string, Cell> = {
    tag: `CL-${String(index).padStart(3, '0')}`,
    description: `Pump ${index}`,
    area: 'Intake',
    application: 'pump',
    ratedPowerKw: powerKw,
    speedRpm: 1460,
    poles: 4,
    voltageV: 400,
    frequencyHz: 50,
    ratedCurrentA: 14.2,
    efficiencyClass: 'IE3',
    nameplateEfficiencyPct: 91.2,
    powerFactor: 0.82,
    frame: '132M',
    enclosure: 'IP55',
    manufacturer: 'Example Motors',
    yearInstalled: 2012,
    rewinds: 0,
    controlMethod: 'DOL',
    hoursPerYear: 6000,
    loadFactor: 0.75,
    dutyProfile: '0.5:2000; 0.8:4000',
    status: 'in service',
    notes: null,
  };
  return IMPORT_FIELD_INFO.map((info) => values[info.field] ?? null);
}

beforeAll(async () => {
  uploadDir = mkdtempSync(join(tmpdir(), 'statorline-uploads-'));
  setUploadDir(uploadDir);
  context = await startTestApp();
  organization = await createOrganization();
  site = await createSite(organization, { name: 'Dairy plant' });
  session = await signIn(context.app, await createUser(organization, 'engineer'));
});
afterAll(async () => {
  await context.close();
  rmSync(uploadDir, { recursive: true, force: true });
});
afterEach(() => {
  delete intakeTestHooks.afterCommitStep;
});

describe('intake: a clean file', () => {
  it('maps the template’s headers by itself, validates every row, commits, and re-importing updates by tag', async () => {
    const file = xlsxOf([cleanHeader, ...Array.from({ length: 20 }, (_, index) => cleanRow(index + 1))]);
    const preview = await upload(session, file, site.id, 'clean.xlsx');
    expect(preview.status).toBe(201);
    expect(preview.body).toMatchObject({ status: 'previewed', rows: { total: 20, valid: 20, invalid: 0 }, errors: [], headerRow: 1, fileName: 'clean.xlsx', siteName: 'Dairy plant' });
    expect(preview.body.mapping).toEqual(Object.fromEntries(IMPORT_FIELD_INFO.map((info) => [info.label, info.field])));
    expect(preview.body.duplicates).toEqual({ inFile: [], inRegister: [] });

    const committed = await session.post(`/api/imports/${preview.body.id}/commit`).expect(200);
    expect(committed.body).toEqual({ created: 20, updated: 0, skipped: 0 });
    const motor = await Motor.findOne({ where: { siteId: site.id, tag: 'CL-007' } });
    expect(motor).toMatchObject({
      ratedPowerKw: 7.5,
      controlMethod: 'direct-on-line',
      status: 'in-service',
      efficiencyClass: 'IE3',
      dutyProfile: [{ fraction: 0.5, hours: 2000 }, { fraction: 0.8, hours: 4000 }],
      importBatchId: preview.body.id,
      version: 0,
    });
    const detail = await session.get(`/api/imports/${preview.body.id}`).expect(200);
    expect(detail.body).toMatchObject({ status: 'committed', progress: 1, createdCount: 20, updatedCount: 0 });

    const again = await upload(session, xlsxOf([cleanHeader, ...Array.from({ length: 20 }, (_, index) => cleanRow(index + 1, 11))]), site.id, 'clean-2.xlsx');
    expect(again.body.rows).toMatchObject({ total: 20, valid: 20 });
    expect(again.body.duplicates.inRegister).toHaveLength(20);
    const second = await session.post(`/api/imports/${again.body.id}/commit`).expect(200);
    expect(second.body).toEqual({ created: 0, updated: 20, skipped: 0 });
    expect(await Motor.count({ where: { siteId: site.id } })).toBe(20);
    await motor!.reload();
    expect(motor).toMatchObject({ ratedPowerKw: 11, version: 1, importBatchId: again.body.id });
    const history = await session.get(`/api/motors/${motor!.id}/history`).expect(200);
    expect(history.body.items[0]).toMatchObject({ action: 'import-update', changes: { importBatchId: again.body.id, changes: { ratedPowerKw: { from: 7.5, to: 11 } } } });

    const list = await session.get(`/api/imports?siteId=${site.id}`).expect(200);
    expect(list.body.items[0]).toMatchObject({ id: again.body.id, fileName: 'clean-2.xlsx', status: 'committed', userName: 'Test engineer', updatedCount: 20 });

    // Undo the second import: the motors get their values of before it back.
    const undo = await session.delete(`/api/imports/${again.body.id}`).expect(200);
    expect(undo.body).toEqual({ removed: 0, restored: 20, status: 'undone' });
    await motor!.reload();
    expect(motor).toMatchObject({ ratedPowerKw: 7.5, importBatchId: preview.body.id });
    // Undo the first: the motors it created are gone.
    const undoFirst = await session.delete(`/api/imports/${preview.body.id}`);
    expect(undoFirst.status).toBe(409);
    expect(undoFirst.body.error.code).toBe('changed-since-import');
  });

  it('removes the motors an import created when it is undone, and refuses once one was edited since', async () => {
    const otherSite = await createSite(organization, { name: 'Cold store' });
    const preview = await upload(session, xlsxOf([cleanHeader, cleanRow(1), cleanRow(2)]), otherSite.id);
    await session.post(`/api/imports/${preview.body.id}/commit`).expect(200);
    const edited = (await Motor.findOne({ where: { siteId: otherSite.id, tag: 'CL-001' } }))!;
    await session.patch(`/api/motors/${edited.id}`).send({ notes: 'checked on site', version: 0 }).expect(200);
    const refused = await session.delete(`/api/imports/${preview.body.id}`);
    expect(refused.status).toBe(409);
    expect(refused.body.error.message).toBe('1 motor(s) of this import were changed since (CL-001); undoing would lose those changes.');
    await session.patch(`/api/motors/${edited.id}`).send({ status: 'standby', version: 1 }).expect(200);

    const fresh = await upload(session, xlsxOf([cleanHeader, cleanRow(50), cleanRow(51)]), otherSite.id);
    await session.post(`/api/imports/${fresh.body.id}/commit`).expect(200);
    expect(await Motor.count({ where: { siteId: otherSite.id } })).toBe(4);
    const undone = await session.delete(`/api/imports/${fresh.body.id}`).expect(200);
    expect(undone.body).toEqual({ removed: 2, restored: 0, status: 'undone' });
    expect(await Motor.count({ where: { siteId: otherSite.id } })).toBe(2);
    expect((await session.post(`/api/imports/${fresh.body.id}/commit`)).status).toBe(409);
  });
});

describe('intake: a messy file', () => {
  const messy: Cell[][] = [
    ['Motor survey — Dairy plant, March'],
    [],
    ['Motor tag', 'Description', 'Line', 'Power', 'Speed', 'Poles', 'Voltage', 'Eff. class', 'PF', 'Hours/yr', 'Control'],
    ['P-101', 'Raw water pump', 'Intake', '7,5 kW', '1460 rpm', 4, '400 V', 'IE 3', '0,85', '6000 h/yr', 'DOL'],
    ['F-201', 'Exhaust fan', 'Drying', '10 hp', 1470, '4p', '0.4 kV', 'eff1', 0.82, 8000, 'VFD'],
    [],
    ['P-101', 'Second pump', 'Intake', 5.5, 2900, 2, 400, 'IE2', 0.8, 4000, 'throttling valve'],
    [null, 'No tag here', 'Intake', 3, 1450, 4, null, null, null, null, null],
    ['C-301', 'Compressor', 'Utilities', null, 2950, 2, 400, 'IE3', 0.88, 7000, 'DOL'],
    ['M-401', 'Mixer', 'Process', 'seven', 980, 6, 400, 'IE9', 1.3, 9000, 'banana'],
    ['K-501', 'Conveyor', 'Packing', '2,2', 1400, null, null, '-', null, '40 h/week', 'star-delta'],
  ];

  it('finds the header under the title, reads units and decimal commas, and lists the exact errors', async () => {
    const messySite = await createSite(organization, { name: 'Messy site' });
    const preview = await upload(session, xlsxOf(messy), messySite.id, 'survey.xlsx');
    expect(preview.status).toBe(201);
    expect(preview.body.headerRow).toBe(3);
    expect(preview.body.mapping).toEqual({
      'Motor tag': 'tag',
      Description: 'description',
      Line: 'area',
      Power: 'ratedPowerKw',
      Speed: 'speedRpm',
      Poles: 'poles',
      Voltage: 'voltageV',
      'Eff. class': 'efficiencyClass',
      PF: 'powerFactor',
      'Hours/yr': 'hoursPerYear',
      Control: 'controlMethod',
    });
    expect(preview.body.rows).toEqual({ total: 7, valid: 2, invalid: 5, warnings: 2 });
    expect(preview.body.errors).toEqual([
      { row: 4, field: 'tag', value: 'P-101', message: 'appears more than once in this file (rows 4, 7); keep one' },
      { row: 7, field: 'tag', value: 'P-101', message: 'appears more than once in this file (rows 4, 7); keep one' },
      { row: 8, field: 'tag', value: null, message: 'is required' },
      { row: 9, field: 'ratedPowerKw', value: null, message: 'is required' },
      { row: 10, field: 'ratedPowerKw', value: 'seven', message: 'is not a number (expected kW, W or hp)' },
      { row: 10, field: 'efficiencyClass', value: 'IE9', message: 'is not one of IE1, IE2, IE3, IE4, IE5, unknown' },
      { row: 10, field: 'powerFactor', value: '1.3', message: 'must be at most 1' },
      { row: 10, field: 'hoursPerYear', value: '9000', message: 'must be at most 8760 h (one year)' },
      { row: 10, field: 'controlMethod', value: 'banana', message: 'is not one of DOL, throttling valve, outlet damper, inlet vanes, VSD' },
    ]);
    expect(preview.body.warnings).toEqual([
      { row: 5, field: 'efficiencyClass', value: 'eff1', message: 'eff1 read as IE2 (the old CEMEP class EFF1 corresponds to IE2)' },
      { row: 11, field: 'poles', value: null, message: 'worked out as 4 from 1400 rpm at 50 Hz' },
    ]);
    expect(preview.body.duplicates.inFile).toEqual([{ tag: 'P-101', rows: [4, 7] }]);

    const valid = await session.get(`/api/imports/${preview.body.id}?filter=valid`).expect(200);
    expect(valid.body.preview.items.map((row: { row: number }) => row.row)).toEqual([5, 11]);
    expect(valid.body.preview.items[0]).toMatchObject({
      action: 'create',
      values: { tag: 'F-201', ratedPowerKw: 7.456998715, poles: 4, voltageV: 400, efficiencyClass: 'IE2', powerFactor: 0.82, hoursPerYear: 8000, controlMethod: 'variable-speed-drive' },
      cells: { 'Motor tag': 'F-201', Power: '10 hp', Voltage: '0.4 kV' },
    });
    expect(valid.body.preview.items[1].values).toMatchObject({ ratedPowerKw: 2.2, poles: 4, efficiencyClass: 'unknown', hoursPerYear: 2085.714286, controlMethod: 'direct-on-line' });
    const invalid = await session.get(`/api/imports/${preview.body.id}?filter=invalid&pageSize=2&page=2`).expect(200);
    expect(invalid.body.preview).toMatchObject({ total: 5, page: 2, pageSize: 2 });
    expect(invalid.body.preview.items.map((row: { row: number }) => row.row)).toEqual([8, 9]);
    const warned = await session.get(`/api/imports/${preview.body.id}?filter=warning`).expect(200);
    expect(warned.body.preview.total).toBe(2);

    const committed = await session.post(`/api/imports/${preview.body.id}/commit`).expect(200);
    expect(committed.body).toEqual({ created: 2, updated: 0, skipped: 5 });
    const fan = await Motor.findOne({ where: { siteId: messySite.id, tag: 'F-201' } });
    expect(fan).toMatchObject({ ratedPowerKw: 7.456998715, voltageV: 400, frequencyHz: 50 });
  });

  it('re-maps a preview, validates again, and remembers the choice for the organisation', async () => {
    const messySite = await createSite(organization, { name: 'Remap site' });
    const preview = await upload(session, xlsxOf(messy), messySite.id);
    const remapped = await session.agent
      .put(`/api/imports/${preview.body.id}/mapping`)
      .set('x-csrf-token', session.token)
      .send({ mapping: { ...preview.body.mapping, Line: null, 'Eff. class': null } })
      .expect(200);
    expect(remapped.body.mapping.Line).toBeNull();
    expect(remapped.body.errors.some((issue: { field: string }) => issue.field === 'efficiencyClass')).toBe(false);
    const unknownHeader = await session.agent.put(`/api/imports/${preview.body.id}/mapping`).set('x-csrf-token', session.token).send({ mapping: { Nope: 'tag' } });
    expect(unknownHeader.status).toBe(400);
    const badField = await session.agent.put(`/api/imports/${preview.body.id}/mapping`).set('x-csrf-token', session.token).send({ mapping: { Line: 'colour' } });
    expect(badField.status).toBe(400);
    expect(badField.body.error.message).toBe('mapping.Line: is not a motor field');

    const next = await upload(session, xlsxOf([['Tag', 'Line', 'Power', 'Poles'], ['Z-1', 'Hall 2', 4, 4]]), messySite.id);
    expect(next.body.mapping).toEqual({ Tag: 'tag', Line: null, Power: 'ratedPowerKw', Poles: 'poles' });
  });
});

describe('intake: hostile files leave the database unchanged', () => {
  async function expectRefused(file: Buffer, fileName: string, status: number, message: RegExp | string) {
    const before = await snapshot(organization.id);
    const response = await upload(session, file, site.id, fileName);
    expect(response.status).toBe(status);
    if (typeof message === 'string') expect(response.body.error.message).toBe(message);
    else expect(response.body.error.message).toMatch(message);
    expect(await snapshot(organization.id)).toEqual(before);
  }

  it('refuses a file that is not a spreadsheet, and a renamed binary', async () => {
    await expectRefused(Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a, 0, 0, 0, 13]), 'motors.xlsx', 400, 'The file is not a spreadsheet: upload an .xlsx, .xls or .csv file.');
    await expectRefused(Buffer.concat([Buffer.from([0x7f, 0x45, 0x4c, 0x46, 2, 1, 1]), Buffer.alloc(4000)]), 'motors.csv', 400, 'The file is not a spreadsheet: upload an .xlsx, .xls or .csv file.');
    // Something that starts like a ZIP but is not one.
    await expectRefused(Buffer.concat([Buffer.from([0x50, 0x4b, 0x03, 0x04]), Buffer.alloc(200, 1)]), 'motors.xlsx', 400, 'The file looks like an .xlsx (ZIP) but its directory cannot be read.');
  });

  it('refuses a sheet of 200,000 rows with 413', async () => {
    const rows: Cell[][] = [['Tag', 'Power'], ...Array.from({ length: 200_000 }, (_, index) => [`T${index}`, (index % 90) + 1])];
    await expectRefused(xlsxOf(rows), 'huge.xlsx', 413, 'The sheet has 200001 rows; at most 100000 data rows can be imported at once. Split the file.');
   }, HEAVY_TEST_MS);

  it('refuses a workbook whose shared-strings table expands beyond the limit, before parsing it', async () => {
    const workbook = XLSX.utils.book_new();
    XLSX.utils.book_append_sheet(workbook, XLSX.utils.aoa_to_sheet([['Tag', 'Power'], ['A', 1]]), 'Motors');
    const file = XLSX.write(workbook, { type: 'buffer', bookType: 'xlsx', bookSST: true }) as Buffer;
    // Patch the central directory: the shared-strings part declares 600 MB once inflated.
    const name = Buffer.from('xl/sharedStrings.xml');
    let patched = false;
    for (let offset = 0; offset < file.length - 46; offset += 1) {
      if (file.readUInt32LE(offset) === 0x02014b50 && file.subarray(offset + 46, offset + 46 + name.length).equals(name)) {
        file.writeUInt32LE(600 * 1024 * 1024, offset + 24);
        patched = true;
      }
    }
    expect(patched).toBe(true);
    await expectRefused(file, 'strings.xlsx', 413, /^The workbook expands to 600 MB \(its shared-strings table: 600 MB\)/);
  });

  it('reads formula-like text as text and never evaluates it', async () => {
    const hostileSite = await createSite(organization, { name: 'Formula site' });
    const sheet = XLSX.utils.aoa_to_sheet([
      ['Tag', 'Description', 'Power', 'Poles'],
      ['=cmd|\'/c calc\'!A1', '+1+1', 5.5, 4],
      ['@SUM(1)', '-2', 3, 2],
    ]);
    sheet.D3 = { t: 'n', f: 'A1*0+2', v: 2 }; // a real formula: only its cached value is read
    const workbook = XLSX.utils.book_new();
    XLSX.utils.book_append_sheet(workbook, sheet, 'Motors');
    const preview = await upload(session, XLSX.write(workbook, { type: 'buffer', bookType: 'xlsx' }) as Buffer, hostileSite.id);
    expect(preview.body.rows).toMatchObject({ total: 2, valid: 2 });
    await session.post(`/api/imports/${preview.body.id}/commit`).expect(200);
    const motors = await Motor.findAll({ where: { siteId: hostileSite.id }, order: [['tag', 'ASC']] });
    expect(motors.map((motor) => [motor.tag, motor.description, motor.poles])).toEqual([
      ["=cmd|'/c calc'!A1", '+1+1', 4],
      ['@SUM(1)', '-2', 2],
    ]);
    const csv = await upload(session, Buffer.from('Tag;Power;Poles\n"=HYPERLINK(""http://x"")";"7,5";4\n'), hostileSite.id, 'motors.csv');
    expect(csv.body.rows).toMatchObject({ total: 1, valid: 1 });
    expect(csv.body.errors).toEqual([]);
  });
});

describe('intake: atomic commit', () => {
  it('leaves the database exactly as before when the commit fails in the middle, and can be committed again', async () => {
    const atomicSite = await createSite(organization, { name: 'Atomic site' });
    const first = await upload(session, xlsxOf([cleanHeader, ...Array.from({ length: 300 }, (_, index) => cleanRow(index + 1))]), atomicSite.id);
    await session.post(`/api/imports/${first.body.id}/commit`).expect(200);
    // 5,000 rows: 300 updates and 4,700 creations; the commit fails once both are written (step 3),
    // before the row outcomes and the audit rows.
    const big = await upload(session, xlsxOf([cleanHeader, ...Array.from({ length: 5000 }, (_, index) => cleanRow(index + 1, 15))]), atomicSite.id);
    expect(big.body.rows).toMatchObject({ total: 5000, valid: 5000 });
    const before = await snapshot(organization.id);
    intakeTestHooks.afterCommitStep = (step) => {
      if (step === 3) throw new Error('injected failure after the motors are written');
    };
    const failed = await session.post(`/api/imports/${big.body.id}/commit`);
    expect(failed.status).toBe(500);
    expect(failed.body.error).toMatchObject({ code: 'commit-failed', message: 'The commit failed and nothing was written (injected failure after the motors are written). Try again.' });
    const after = await snapshot(organization.id);
    expect(after.motors).toEqual(before.motors);
    expect(after.counts).toEqual(before.counts);
    const batch = await ImportBatch.findByPk(big.body.id);
    expect(batch).toMatchObject({ status: 'failed', progress: 0, createdCount: 0 });

    delete intakeTestHooks.afterCommitStep;
    // Every other staged row rewritten, so the table no longer holds the rows in the file's order.
    await database().query(`UPDATE import_rows SET warnings = warnings WHERE batch_id = ${big.body.id as number} AND row_number % 2 = 0`);
    const retried = await session.post(`/api/imports/${big.body.id}/commit`).expect(200);
    expect(retried.body).toEqual({ created: 4700, updated: 300, skipped: 0 });
    expect(await Motor.count({ where: { siteId: atomicSite.id } })).toBe(5000);
    // The created motors are numbered in the file's row order.
    const [created] = await database().query(`SELECT motor_id FROM import_rows WHERE batch_id = ${big.body.id as number} AND action = 'create' ORDER BY row_number`);
    const ids = (created as Array<{ motor_id: number }>).map((row) => row.motor_id);
    expect(ids).toHaveLength(4700);
    expect(ids).toEqual([...ids].sort((a, b) => a - b));
   }, HEAVY_TEST_MS);

  it('refuses to commit a batch with no valid row, and to commit twice', async () => {
    const preview = await upload(session, xlsxOf([['Tag', 'Power', 'Poles'], ['A-1', 'lots', 4]]), site.id);
    const empty = await session.post(`/api/imports/${preview.body.id}/commit`);
    expect(empty.status).toBe(409);
    expect(empty.body.error.code).toBe('nothing-to-commit');
    const good = await upload(session, xlsxOf([['Tag', 'Power', 'Poles'], ['ONCE-1', 4, 4]]), site.id);
    await session.post(`/api/imports/${good.body.id}/commit`).expect(200);
    const twice = await session.post(`/api/imports/${good.body.id}/commit`);
    expect(twice.status).toBe(409);
    expect(twice.body.error.code).toBe('not-committable');
  });
});

describe('intake: roles, isolation, template', () => {
  it('refuses an approver’s and a viewer’s import with 403 but lets them see batches', async () => {
    for (const role of ['approver', 'viewer'] as const) {
      const reader = await signIn(context.app, await createUser(organization, role));
      const response = await upload(reader, xlsxOf([['Tag', 'Power', 'Poles'], ['R-1', 4, 4]]), site.id);
      expect(response.status).toBe(403);
      await reader.get('/api/imports').expect(200);
    }
  });

  it('answers 404 for another organisation’s import and refuses its site', async () => {
    const preview = await upload(session, xlsxOf([['Tag', 'Power', 'Poles'], ['ISO-1', 4, 4]]), site.id);
    const other = await createOrganization();
    const stranger = await signIn(context.app, await createUser(other, 'admin'));
    await stranger.get(`/api/imports/${preview.body.id}`).expect(404);
    expect((await stranger.post(`/api/imports/${preview.body.id}/commit`)).status).toBe(404);
    expect((await stranger.delete(`/api/imports/${preview.body.id}`)).status).toBe(404);
    const wrongSite = await upload(stranger, xlsxOf([['Tag', 'Power', 'Poles'], ['ISO-1', 4, 4]]), site.id);
    expect(wrongSite.status).toBe(400);
    expect(wrongSite.body.error.message).toBe('siteId: no such site');
  });

  it('serves a template with every field and its unit', async () => {
    const response = await session.get('/api/imports/template').buffer(true).parse((res, callback) => {
      const chunks: Buffer[] = [];
      res.on('data', (chunk: Buffer) => chunks.push(chunk));
      res.on('end', () => callback(null, Buffer.concat(chunks)));
    });
    expect(response.status).toBe(200);
    const workbook = XLSX.read(response.body as Buffer, { type: 'buffer' });
    expect(workbook.SheetNames).toEqual(['Motors', 'Fields']);
    const header = XLSX.utils.sheet_to_json<Cell[]>(workbook.Sheets.Motors!, { header: 1 })[0];
    expect(header).toEqual(IMPORT_FIELD_INFO.map((info) => info.label));
    expect(header).toContain('Rated power (kW)');
    expect(header).toContain('Hours per year (h/yr)');
    const fields = XLSX.utils.sheet_to_json<Record<string, string>>(workbook.Sheets.Fields!);
    expect(fields.find((row) => row.Field === 'voltageV')).toMatchObject({ Unit: 'V', 'Other units accepted': 'kV' });
  });

  it('reads a bare number in the unit its header names', async () => {
    const unitSite = await createSite(organization, { name: 'Units site' });
    const preview = await upload(session, xlsxOf([['Tag', 'Power (hp)', 'Voltage [kV]', 'Poles', 'Efficiency (%)'], ['U-1', 10, 0.69, 4, '0,912']]), unitSite.id);
    const detail = await session.get(`/api/imports/${preview.body.id}`).expect(200);
    expect(detail.body.preview.items[0].values).toMatchObject({ ratedPowerKw: 7.456998715, voltageV: 690, nameplateEfficiencyPct: 91.2 });
  });
});
