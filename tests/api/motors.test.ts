import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import * as XLSX from 'xlsx';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { setUploadDir } from '../../server/lib/uploads.js';
import { AuditLog, Motor, type Organization, type Site } from '../../server/models/index.js';
import { createOrganization, createSite, createUser, signIn, startTestApp, type TestContext } from '../support/api.js';

let context: TestContext;
let organization: Organization;
let other: Organization;
let site: Site;
let uploadDir: string;

const validMotor = (siteId: number, tag: string, extra: Record<string, unknown> = {}) => ({
  siteId,
  tag,
  ratedPowerKw: 7.5,
  poles: 4,
  voltageV: 400,
  frequencyHz: 50,
  ...extra,
});

let counter = 0;
/** A motor row straight into the database (factories never go through the API under test). */
export async function createMotor(target: Site, overrides: Partial<Parameters<typeof Motor.create>[0]> = {}) {
  counter += 1;
  return Motor.create({
    organizationId: target.organizationId,
    siteId: target.id,
    tag: `M-${counter}`,
    description: null,
    area: null,
    application: 'pump',
    ratedPowerKw: 11,
    speedRpm: 1460,
    poles: 4,
    voltageV: 400,
    frequencyHz: 50,
    ratedCurrentA: null,
    efficiencyClass: 'IE2',
    nameplateEfficiencyPct: null,
    powerFactor: null,
    frame: null,
    enclosure: null,
    manufacturer: null,
    yearInstalled: null,
    controlMethod: 'direct-on-line',
    hoursPerYear: 6000,
    loadFactor: null,
    dutyProfile: null,
    ...overrides,
  });
}

beforeAll(async () => {
  uploadDir = mkdtempSync(join(tmpdir(), 'statorline-uploads-'));
  setUploadDir(uploadDir);
  context = await startTestApp();
  organization = await createOrganization();
  other = await createOrganization();
  site = await createSite(organization, { name: 'Dairy plant' });
});
afterAll(async () => {
  await context.close();
  rmSync(uploadDir, { recursive: true, force: true });
});

describe('motors: CRUD', () => {
  it('lets an engineer add a motor with defaults filled, and records who did it', async () => {
    const engineer = await createUser(organization, 'engineer');
    const session = await signIn(context.app, engineer);
    const response = await session.post('/api/motors').send(validMotor(site.id, 'P-101', { description: 'Raw water pump', dutyProfile: [{ fraction: 0.8, hours: 4000 }] }));
    expect(response.status).toBe(201);
    expect(response.body).toMatchObject({
      tag: 'P-101',
      siteName: 'Dairy plant',
      application: 'other',
      efficiencyClass: 'unknown',
      controlMethod: 'direct-on-line',
      status: 'in-service',
      rewinds: 0,
      version: 0,
      dutyProfile: [{ fraction: 0.8, hours: 4000 }],
    });
    const audit = await AuditLog.findOne({ where: { entity: 'motor', entityId: response.body.id } });
    expect(audit).toMatchObject({ userId: engineer.id, action: 'create' });
  });

  it('names the field and the rule of invalid input, with the same rules as calc', async () => {
    const session = await signIn(context.app, await createUser(organization, 'admin'));
    const poles = await session.post('/api/motors').send(validMotor(site.id, 'X-1', { poles: 5 }));
    expect(poles.status).toBe(400);
    expect(poles.body.error.message).toBe('poles: must be 2, 4, 6 or 8');
    const hours = await session.post('/api/motors').send(validMotor(site.id, 'X-1', { hoursPerYear: 9000 }));
    expect(hours.body.error.message).toBe('hoursPerYear: must be at most 8760 h (one year)');
    const profile = await session.post('/api/motors').send(validMotor(site.id, 'X-1', { dutyProfile: [{ fraction: 0.5, hours: 5000 }, { fraction: 1, hours: 4000 }] }));
    expect(profile.body.error.message).toBe('dutyProfile: hours must add up to 8760 or less');
    const power = await session.post('/api/motors').send(validMotor(site.id, 'X-1', { ratedPowerKw: 0.05 }));
    expect(power.body.error.message).toBe('ratedPowerKw: must be between 0.12 and 1000 kW');
    const foreignSite = await createSite(other);
    const wrongSite = await session.post('/api/motors').send(validMotor(foreignSite.id, 'X-1'));
    expect(wrongSite.status).toBe(400);
    expect(wrongSite.body.error.message).toBe('siteId: no such site');
  });

  it('refuses a second motor with the same tag at the same site (409 duplicate-tag)', async () => {
    const session = await signIn(context.app, await createUser(organization, 'engineer'));
    await session.post('/api/motors').send(validMotor(site.id, 'DUP-1')).expect(201);
    const again = await session.post('/api/motors').send(validMotor(site.id, 'DUP-1'));
    expect(again.status).toBe(409);
    expect(again.body.error.code).toBe('duplicate-tag');
  });

  it('edits with the loaded version and refuses a stale edit with 409, never overwriting', async () => {
    const motor = await createMotor(site);
    const first = await signIn(context.app, await createUser(organization, 'engineer'));
    const second = await signIn(context.app, await createUser(organization, 'engineer'));
    const edited = await first.patch(`/api/motors/${motor.id}`).send({ ratedPowerKw: 15, version: 0 }).expect(200);
    expect(edited.body).toMatchObject({ ratedPowerKw: 15, version: 1 });
    const stale = await second.patch(`/api/motors/${motor.id}`).send({ ratedPowerKw: 18.5, version: 0 });
    expect(stale.status).toBe(409);
    expect(stale.body.error.code).toBe('stale-version');
    expect((await first.get(`/api/motors/${motor.id}`)).body.ratedPowerKw).toBe(15);
    const history = await first.get(`/api/motors/${motor.id}/history`).expect(200);
    expect(history.body.items[0]).toMatchObject({ action: 'update', changes: { ratedPowerKw: { from: 11, to: 15 } }, userName: 'Test engineer' });
  });

  it('retires on DELETE: the motor leaves the default list, keeps its history, and a stale retire is refused', async () => {
    const motor = await createMotor(site, { tag: 'RET-1' });
    const session = await signIn(context.app, await createUser(organization, 'engineer'));
    const stale = await session.delete(`/api/motors/${motor.id}?version=3`);
    expect(stale.status).toBe(409);
    const retired = await session.delete(`/api/motors/${motor.id}?version=0`).expect(200);
    expect(retired.body).toMatchObject({ status: 'retired', version: 1 });
    const list = await session.get(`/api/motors?siteId=${site.id}&q=RET-1`).expect(200);
    expect(list.body.total).toBe(0);
    const retiredList = await session.get(`/api/motors?siteId=${site.id}&q=RET-1&status=retired`).expect(200);
    expect(retiredList.body.total).toBe(1);
    const history = await session.get(`/api/motors/${motor.id}/history`).expect(200);
    expect(history.body.items[0].action).toBe('retire');
  });
});

describe('motors: roles and isolation', () => {
  it('refuses a viewer’s and an approver’s writes with 403 but lets them read', async () => {
    const motor = await createMotor(site);
    for (const role of ['viewer', 'approver'] as const) {
      const session = await signIn(context.app, await createUser(organization, role));
      expect((await session.post('/api/motors').send(validMotor(site.id, `V-${role}`))).status).toBe(403);
      expect((await session.patch(`/api/motors/${motor.id}`).send({ ratedPowerKw: 3, version: 0 })).status).toBe(403);
      expect((await session.delete(`/api/motors/${motor.id}`)).status).toBe(403);
      expect((await session.post(`/api/motors/${motor.id}/measurements`).send({ measuredAt: '2026-03-01', currentA: 10 })).status).toBe(403);
      await session.get(`/api/motors/${motor.id}`).expect(200);
      await session.get('/api/motors').expect(200);
    }
  });

  it('answers 404 for another organisation’s motor, everywhere', async () => {
    const foreign = await createMotor(await createSite(other), { tag: 'NOT-YOURS' });
    const session = await signIn(context.app, await createUser(organization, 'admin'));
    await session.get(`/api/motors/${foreign.id}`).expect(404);
    expect((await session.patch(`/api/motors/${foreign.id}`).send({ ratedPowerKw: 3, version: 0 })).status).toBe(404);
    expect((await session.delete(`/api/motors/${foreign.id}`)).status).toBe(404);
    await session.get(`/api/motors/${foreign.id}/history`).expect(404);
    await session.get(`/api/motors/${foreign.id}/measurements`).expect(404);
    await session.get(`/api/motors/${foreign.id}/files`).expect(404);
    const list = await session.get('/api/motors?q=NOT-YOURS').expect(200);
    expect(list.body.total).toBe(0);
  });
});

describe('motors: the register list', () => {
  let listSite: Site;
  let session: Awaited<ReturnType<typeof signIn>>;
  beforeAll(async () => {
    const organizationForList = await createOrganization();
    listSite = await createSite(organizationForList, { name: 'Cold store' });
    const second = await createSite(organizationForList, { name: 'Wastewater works' });
    await createMotor(listSite, { tag: 'F-01', application: 'fan', ratedPowerKw: 5.5, area: 'Freezer hall', efficiencyClass: 'IE3' });
    await createMotor(listSite, { tag: 'F-02', application: 'fan', ratedPowerKw: 22, area: 'Freezer hall', controlMethod: 'variable-speed-drive' });
    await createMotor(listSite, { tag: 'P-01', application: 'pump', ratedPowerKw: 45, area: 'Brine', manufacturer: 'Example Motorworks' });
    await createMotor(listSite, { tag: 'C-01', application: 'compressor', ratedPowerKw: 110, area: 'Engine room', description: 'Ammonia screw compressor' });
    await createMotor(second, { tag: 'P-01', application: 'pump', ratedPowerKw: 75, area: 'Aeration' });
    await createMotor(second, { tag: 'X-99', application: 'other', ratedPowerKw: 1.1, status: 'retired' });
    session = await signIn(context.app, await createUser(organizationForList, 'viewer'));
  });

  it('pages and sorts, with a stable tie-breaker', async () => {
    const page = await session.get('/api/motors?page=2&pageSize=2&sort=-ratedPowerKw').expect(200);
    expect(page.body).toMatchObject({ total: 5, page: 2, pageSize: 2 });
    expect(page.body.items.map((motor: { ratedPowerKw: number }) => motor.ratedPowerKw)).toEqual([45, 22]);
    const byTag = await session.get('/api/motors?sort=tag&pageSize=10').expect(200);
    expect(byTag.body.items.map((motor: { tag: string }) => motor.tag)).toEqual(['C-01', 'F-01', 'F-02', 'P-01', 'P-01']);
    const badSort = await session.get('/api/motors?sort=organizationId');
    expect(badSort.status).toBe(400);
    expect(badSort.body.error.details[0].field).toBe('sort');
  });

  it('filters by site, application (one or several), class, power range, control, area and free text', async () => {
    const count = async (query: string) => (await session.get(`/api/motors?${query}`).expect(200)).body.total as number;
    expect(await count(`siteId=${listSite.id}`)).toBe(4);
    expect(await count('application=fan')).toBe(2);
    expect(await count('application=fan,pump')).toBe(4);
    expect(await count('application=fan&application=compressor')).toBe(3);
    expect(await count('efficiencyClass=IE3')).toBe(1);
    expect(await count('minKw=20&maxKw=75')).toBe(3);
    expect(await count('controlMethod=variable-speed-drive')).toBe(1);
    expect(await count('area=freezer%20hall')).toBe(2);
    expect(await count('q=ammonia')).toBe(1);
    expect(await count('q=motorworks')).toBe(1);
    expect(await count('q=p-0')).toBe(2);
    expect(await count('q=100%25')).toBe(0);
    expect(await count('status=retired')).toBe(1);
    const bad = await session.get('/api/motors?application=toaster');
    expect(bad.status).toBe(400);
    expect(bad.body.error.details[0].field).toBe('application.0');
  });

  it('exports the filtered register to .xlsx, with formula-like text neutralised', async () => {
    await createMotor(listSite, { tag: '=HYPERLINK("http://example.invalid","x")', description: '+SUM(A1:A9)', area: '@risk', notes: '−1', application: 'mixer', ratedPowerKw: 3 });
    const response = await session.get('/api/motors/export?application=mixer,fan&sort=tag').buffer(true).parse((res, callback) => {
      const chunks: Buffer[] = [];
      res.on('data', (chunk: Buffer) => chunks.push(chunk));
      res.on('end', () => callback(null, Buffer.concat(chunks)));
    });
    expect(response.status).toBe(200);
    expect(response.headers['content-type']).toContain('spreadsheetml');
    expect(response.headers['content-disposition']).toMatch(/^attachment; filename="motor-register-/);
    const workbook = XLSX.read(response.body as Buffer, { type: 'buffer' });
    const rows = XLSX.utils.sheet_to_json<Record<string, unknown>>(workbook.Sheets.Motors!, { defval: null });
    expect(rows).toHaveLength(3);
    const hostile = rows.find((row) => String(row.Tag).includes('HYPERLINK'))!;
    expect(hostile.Tag).toBe('\'=HYPERLINK("http://example.invalid","x")');
    expect(hostile.Description).toBe("'+SUM(A1:A9)");
    expect(hostile.Area).toBe("'@risk");
    expect(hostile.Notes).toBe("'−1");
    expect(hostile['Rated power (kW)']).toBe(3);
    // No cell of the file is a formula.
    const sheet = workbook.Sheets.Motors!;
    expect(Object.keys(sheet).filter((key) => !key.startsWith('!') && (sheet[key] as XLSX.CellObject).f !== undefined)).toEqual([]);
  });
});

describe('motors: measurements and files', () => {
  it('records and lists field measurements, with at least one reading', async () => {
    const motor = await createMotor(site);
    const session = await signIn(context.app, await createUser(organization, 'engineer'));
    const created = await session.post(`/api/motors/${motor.id}/measurements`).send({ measuredAt: '2026-02-11T09:30:00Z', inputPowerKw: 8.2, speedRpm: 1475, currentA: 14.1, note: 'clamp meter' });
    expect(created.status).toBe(201);
    expect(created.body).toMatchObject({ motorId: motor.id, inputPowerKw: 8.2, speedRpm: 1475, currentA: 14.1, voltageV: null, measuredAt: '2026-02-11T09:30:00.000Z' });
    const empty = await session.post(`/api/motors/${motor.id}/measurements`).send({ measuredAt: '2026-02-11', note: 'forgot' });
    expect(empty.status).toBe(400);
    expect(empty.body.error.message).toBe('inputPowerKw: give at least one of inputPowerKw, speedRpm, currentA');
    const list = await session.get(`/api/motors/${motor.id}/measurements`).expect(200);
    expect(list.body.items).toHaveLength(1);
  });

  it('stores a nameplate photo under a random name and sends it back as an attachment with nosniff', async () => {
    const motor = await createMotor(site);
    const session = await signIn(context.app, await createUser(organization, 'engineer'));
    const png = Buffer.concat([Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]), Buffer.alloc(100, 7)]);
    const uploaded = await session.post(`/api/motors/${motor.id}/files`).field('kind', 'nameplate-photo').attach('file', png, { filename: '../../etc/plate "1".png', contentType: 'text/html' });
    expect(uploaded.status).toBe(201);
    expect(uploaded.body).toMatchObject({ kind: 'nameplate-photo', contentType: 'image/png', sizeBytes: 108, fileName: 'plate 1.png' });
    const download = await session.get(`/api/motors/${motor.id}/files/${uploaded.body.id}`).expect(200);
    expect(download.headers['content-type']).toBe('image/png');
    expect(download.headers['content-disposition']).toBe('attachment; filename="plate 1.png"; filename*=UTF-8\'\'plate%201.png');
    expect(download.headers['x-content-type-options']).toBe('nosniff');
    const list = await session.get(`/api/motors/${motor.id}/files`).expect(200);
    expect(list.body.items).toHaveLength(1);
  });

  it('refuses a file that is not an image or a PDF, whatever its name says', async () => {
    const motor = await createMotor(site);
    const session = await signIn(context.app, await createUser(organization, 'engineer'));
    const html = await session.post(`/api/motors/${motor.id}/files`).field('kind', 'document').attach('file', Buffer.from('<html><script>alert(1)</script></html>'), { filename: 'datasheet.pdf', contentType: 'application/pdf' });
    expect(html.status).toBe(415);
    expect(html.body.error.message).toBe('file: only JPEG, PNG or WebP images and PDF documents can be attached');
    const pdfAsPhoto = await session.post(`/api/motors/${motor.id}/files`).field('kind', 'nameplate-photo').attach('file', Buffer.from('%PDF-1.4\n%%EOF'), 'plate.pdf');
    expect(pdfAsPhoto.status).toBe(400);
    const missing = await session.post(`/api/motors/${motor.id}/files`).field('kind', 'document');
    expect(missing.status).toBe(400);
    const tooBig = await session.post(`/api/motors/${motor.id}/files`).attach('file', Buffer.concat([Buffer.from('%PDF-1.4\n'), Buffer.alloc(10 * 1024 * 1024 + 10)]), 'big.pdf');
    expect(tooBig.status).toBe(413);
    const viewer = await signIn(context.app, await createUser(organization, 'viewer'));
    expect((await viewer.post(`/api/motors/${motor.id}/files`).attach('file', Buffer.from('%PDF-1.4\n'), 'a.pdf')).status).toBe(403);
  });
});
