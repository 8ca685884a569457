/**
 * Organisation isolation for every resource type (issue 10, security). Two organisations hold a row
 * of every kind (tests/support/security.ts). Signed in to B, every route of `registeredRoutes` with
 * a path parameter is called with A's ids and must answer 404 — never 200, 403 or 409, which would
 * tell that the row exists — and must leave A's data as it was; the routes that take ids in their
 * body or query are tried with A's ids there too; and no list, export or summary B can read shows
 * anything of A's (each organisation's texts carry its own marker).
 */
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import * as XLSX from 'xlsx';
import { registeredRoutes, type RouteSpec } from '../../server/lib/routing.js';
import { setUploadDir } from '../../server/lib/uploads.js';
import type { Role } from '../../server/shared/roles.js';
import { startTestApp, type TestContext } from '../support/api.js';
import {
  ASSESS_INPUT,
  databaseSnapshot,
  fillPath,
  jobsSettled,
  pathParams,
  populateOrganization,
  routeKey,
  send,
  sendInput,
  SIZE_INPUT,
  validInput,
  type OrgFixture,
  type Session,
} from '../support/security.js';

let context: TestContext;
let a: OrgFixture;
let b: OrgFixture;
let uploadDir: string;

beforeAll(async () => {
  uploadDir = mkdtempSync(join(tmpdir(), 'statorline-isolation-'));
  setUploadDir(uploadDir);
  context = await startTestApp({ signInAttemptsPerWindow: 1000 });
  a = await populateOrganization(context, 'a');
  b = await populateOrganization(context, 'b');
  await jobsSettled();
}, 120_000);
afterAll(async () => {
  await context.close();
  rmSync(uploadDir, { recursive: true, force: true });
});

/** B's session of a role the route admits (the administrator where possible), so the role check passes. */
function callerFor(spec: RouteSpec, fixture: OrgFixture): Session {
  const role: Role = spec.access === 'public' || spec.access === 'signed-in' || spec.access.includes('admin') ? 'admin' : spec.access[0]!;
  return fixture.sessions[role];
}

/**
 * The sessions table changes with every request (rolling sessions) and is no data of an
 * organisation; everything else — A's rows, B's rows, audit entries, jobs, outbox — must stay as it was.
 */
const NOT_DATA = ['session'];

/** The answer as text, with .xlsx workbooks unpacked to their cells. */
async function answerText(session: Session, path: string): Promise<{ status: number; text: string }> {
  const response = await session.agent
    .get(`/api${path}`)
    .buffer(true)
    .parse((res, callback) => {
      const chunks: Buffer[] = [];
      res.on('data', (chunk: Buffer) => chunks.push(chunk));
      res.on('end', () => callback(null, Buffer.concat(chunks)));
    });
  const bytes = response.body as Buffer;
  if (bytes.subarray(0, 2).toString('latin1') === 'PK') {
    const workbook = XLSX.read(bytes, { type: 'buffer' });
    return { status: response.status, text: JSON.stringify(workbook.SheetNames.map((name) => XLSX.utils.sheet_to_json(workbook.Sheets[name]!, { header: 1 }))) };
  }
  return { status: response.status, text: bytes.toString('utf8') };
}

describe('organisation isolation', () => {
  it('answers 404 to every route called with another organisation’s ids, and changes nothing', async () => {
    const before = await databaseSnapshot(NOT_DATA);
    const withIds = registeredRoutes.filter((spec) => pathParams(spec.path).length > 0);
    expect(withIds.length).toBeGreaterThan(40);
    const problems: string[] = [];
    const resources = new Set<string>();
    for (const spec of withIds) {
      const path = fillPath(spec.path, (resource) => {
        resources.add(resource);
        return a.ids[resource];
      });
      const response = await sendInput(callerFor(spec, b), spec, path, validInput(spec, a));
      if (response.status !== 404 || response.body?.error?.code !== 'not-found') {
        problems.push(`${routeKey(spec)} → ${spec.method.toUpperCase()} ${path}: ${response.status} ${JSON.stringify(response.body).slice(0, 300)}`);
      }
    }
    expect(problems).toEqual([]);
    await jobsSettled();
    expect(await databaseSnapshot(NOT_DATA)).toEqual(before);
    // Every kind of row a path can name was tried.
    expect([...resources].sort()).toEqual(Object.keys(a.ids).sort());
    console.info(`isolation: ${withIds.length} routes with ids of another organisation, all 404 (${resources.size} resource types)`);
  }, 60_000);

  it('answers an id of another organisation in a body or a form field exactly as an id that does not exist', async () => {
    const before = await databaseSnapshot(NOT_DATA);
    const admin = b.sessions.admin;
    const MISSING = 2_000_000_000;
    // Each request names a row by `id`; A's row must be refused as if it did not exist (404, or the
    // service's 400 "no such site" where the id is a field), never accepted or told apart.
    const cases: { label: string; test: (id: number) => ReturnType<Session['post']>; ofA: number }[] = [
      { label: 'motor on A’s site', ofA: a.ids.site, test: (id) => admin.post('/api/motors').send({ siteId: id, tag: 'X-1', ratedPowerKw: 5, poles: 4, voltageV: 400, frequencyHz: 50 }) },
      { label: 'B’s motor moved to A’s site', ofA: a.ids.site, test: (id) => admin.patch(`/api/motors/${b.ids.motor}`).send({ version: b.motor.version, siteId: id }) },
      { label: 'business case of A’s site', ofA: a.ids.site, test: (id) => admin.post('/api/cases').send({ siteId: id }) },
      { label: 'retrofit of A’s motor', ofA: a.ids.motor, test: (id) => admin.post('/api/retrofits').send({ motorId: id, optionCode: 'ie4' }) },
      { label: 'design for A’s motor', ofA: a.ids.motor, test: (id) => admin.post('/api/designs').send({ ...SIZE_INPUT, motorId: id }) },
      { label: 'study of A’s motor', ofA: a.ids.motor, test: (id) => admin.post('/api/studies').send({ ...ASSESS_INPUT, motorId: id }) },
      { label: 'B’s motor linked to A’s design', ofA: a.ids.design, test: (id) => admin.post(`/api/motors/${b.ids.motor}/design`).send({ designId: id }) },
      { label: 'proposal of A’s motor from B’s screening', ofA: a.ids.motor, test: (id) => admin.post(`/api/screenings/${b.ids.job}/proposals`).send({ motorIds: [id] }) },
      {
        label: 'import into A’s site',
        ofA: a.ids.site,
        test: (id) => admin.post('/api/imports').field('siteId', String(id)).attach('file', Buffer.from('Tag,Rated power [kW],Poles\nX-2,7.5,4\n'), 'motors.csv'),
      },
    ];
    const problems: string[] = [];
    for (const { label, test, ofA } of cases) {
      const foreign = await test(ofA);
      const missing = await test(MISSING);
      // A message may repeat the id it was sent; apart from that the two answers must be the same.
      const answer = (r: typeof foreign, id: number) => `${r.status} ${r.body?.error?.code} ${String(r.body?.error?.message).replaceAll(String(id), '#')}`;
      if (foreign.status < 400 || foreign.status >= 500 || answer(foreign, ofA) !== answer(missing, MISSING)) {
        problems.push(`${label}: ${answer(foreign, ofA)}; for a missing id: ${answer(missing, MISSING)}`);
      }
    }
    expect(problems).toEqual([]);
    await jobsSettled();
    expect(await databaseSnapshot(NOT_DATA)).toEqual(before);
  }, 60_000);

  it('never shows another organisation’s rows in a list, export or summary', async () => {
    const lists = registeredRoutes.filter((spec) => spec.method === 'get' && pathParams(spec.path).length === 0);
    // Lists filtered by A's ids as well: the filter must not open a door.
    const filtered = [
      `/motors?siteId=${a.ids.site}`,
      `/motors/export?siteId=${a.ids.site}`,
      `/retrofits?siteId=${a.ids.site}`,
      `/retrofits?motorId=${a.ids.motor}`,
      `/retrofits/verification-summary?siteId=${a.ids.site}`,
      `/imports?siteId=${a.ids.site}`,
      `/studies?motorId=${a.ids.motor}`,
      `/designs?motorId=${a.ids.motor}`,
      `/cases?siteId=${a.ids.site}`,
      `/motors?q=${a.marker}`,
      `/outbox?q=${a.marker}`,
      `/users?q=${a.marker}`,
    ];
    const problems: string[] = [];
    const showsOwn = new Set<string>();
    const calls: { spec: RouteSpec | undefined; path: string }[] = [...lists.map((spec) => ({ spec, path: spec.path })), ...filtered.map((path) => ({ spec: lists.find((l) => l.path === path.split('?')[0]), path }))];
    for (const { spec, path } of calls) {
      const session = spec ? callerFor(spec, b) : b.sessions.admin;
      const { status, text } = await answerText(session, path);
      if (status >= 500) problems.push(`${path}: ${status}`);
      if (text.includes(a.marker)) problems.push(`${path} shows A’s rows: ${text.slice(0, 300)}`);
      if (text.includes(b.marker)) showsOwn.add(path);
    }
    expect(problems).toEqual([]);
    // The check can see rows at all: B's own rows are in B's lists.
    for (const path of ['/sites', '/motors', '/motors/export', '/imports', '/studies', '/designs', '/cases', '/retrofits', '/outbox', '/users', '/settings']) {
      expect(showsOwn, path).toContain(path);
    }
    console.info(`isolation: ${calls.length} lists, exports and summaries without A’s marker; ${showsOwn.size} show B’s own`);
  }, 60_000);

  it('keeps the other organisation’s session users out of B’s user-specific routes', async () => {
    // Same-role users of A and B see their own identity only.
    const meA = await send(a.sessions.viewer, 'get', '/auth/me');
    const meB = await send(b.sessions.viewer, 'get', '/auth/me');
    expect(JSON.stringify(meB.body)).not.toContain(a.marker);
    expect(JSON.stringify(meA.body)).not.toContain(b.marker);
  });
});
