/**
 * Fuzzing every write route (issue 10, security): random and malformed JSON — wrong types, huge
 * strings, deep nesting, prototype-pollution keys, NaN-ish strings, broken UTF-8, arrays for
 * objects, empty and non-JSON bodies under application/json — to every post/put/patch/delete of
 * `registeredRoutes`, as an administrator, and random files with random form fields to every upload
 * route. The answer is never a 5xx, and refused input never changes the database (row count and md5
 * of every table, before and after). Fixed seed, bounded runs; fast-check prints the seed and the
 * counterexample of a failure.
 */
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import fc from 'fast-check';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { registeredRoutes, type RouteSpec } from '../../server/lib/routing.js';
import { setUploadDir } from '../../server/lib/uploads.js';
import { createUser, signIn, startTestApp, type TestContext } from '../support/api.js';
import {
  databaseSnapshot,
  fillPath,
  isWrite,
  jobsSettled,
  pathParams,
  populateOrganization,
  routeKey,
  send,
  validInput,
  type OrgFixture,
  type Session,
} from '../support/security.js';

/** Fixed, so a run is repeatable; FUZZ_SEED and FUZZ_RUNS explore further by hand. */
const SEED = Number(process.env.FUZZ_SEED ?? 20261210);
const RUNS_PER_ROUTE = Number(process.env.FUZZ_RUNS ?? 20);
/** An id no row has: requests whose input the route would accept go there, so they change nothing. */
const MISSING = 2_000_000_000;

/**
 * `session` is left out of the snapshot: sessions roll on every request (a new expiry), and sign-out
 * fuzzing ends a session, neither of which is data. Every other table, audit_logs included, must
 * stay as it was: a refused request writes no audit entry either.
 */
const NOT_DATA = ['session'];

let context: TestContext;
let fixture: OrgFixture;
let uploadDir: string;

beforeAll(async () => {
  uploadDir = mkdtempSync(join(tmpdir(), 'statorline-fuzz-'));
  setUploadDir(uploadDir);
  // Sign-in fuzzing must reach the route, not the address limit.
  context = await startTestApp({ signInAttemptsPerWindow: 100_000 });
  fixture = await populateOrganization(context, 'f');
  await jobsSettled();
}, 120_000);
afterAll(async () => {
  await context.close();
  rmSync(uploadDir, { recursive: true, force: true });
});

const isUpload = (spec: RouteSpec) => /multipart/i.test(spec.summary);

// ---------------------------------------------------------------------------------------------
// Malformed JSON

const nanIsh = fc.constantFrom('NaN', 'Infinity', '-Infinity', '-0', '1e999', '0x1F', ' 12 ', '١٢', '12abc', '', 'null', 'undefined', 'true');
const hugeString = fc.integer({ min: 10_000, max: 300_000 }).map((length) => 'Ω'.repeat(length));
const weird = fc.oneof(
  nanIsh,
  hugeString,
  fc.string({ unit: 'binary', maxLength: 40 }),
  fc.constantFrom(null, true, false, 0, -1, 1e308, -1e308, Number.MAX_SAFE_INTEGER + 2, 0.1, 2_147_483_648, -2_147_483_649),
  fc.array(fc.integer(), { maxLength: 5 }),
  fc.dictionary(fc.string({ maxLength: 8 }), fc.integer(), { maxKeys: 3 }),
  fc.constant(JSON.parse('{"__proto__":{"admin":true}}') as unknown),
);

/** A raw body: text sent as is under application/json. */
type Raw = { text: string } | { bytes: Buffer };

const deepNesting = fc.integer({ min: 100, max: 20_000 }).chain((depth) =>
  fc.constantFrom<Raw>({ text: '['.repeat(depth) + ']'.repeat(depth) }, { text: '{"a":'.repeat(depth) + '1' + '}'.repeat(depth) }),
);
const notJson = fc.constantFrom<Raw>(
  { text: '' },
  { text: 'not json' },
  { text: '{' },
  { text: "{'single': 1}" },
  { text: '{"a":1,}' },
  { text: '"just a string"' },
  { text: '42' },
  { text: 'null' },
  { text: 'NaN' },
  { text: '{"a":NaN}' },
  { text: '{"__proto__":{"isAdmin":true},"constructor":{"prototype":{"polluted":1}}}' },
  { text: '{"constructor":{"prototype":{"role":"admin"}}}' },
  { text: '\uFEFF{}' },
  { bytes: Buffer.from([0x7b, 0x22, 0x61, 0x22, 0x3a, 0x22, 0xff, 0xfe, 0xc3, 0x28, 0xed, 0xa0, 0x80, 0x22, 0x7d]) },
  { bytes: Buffer.from([0xff, 0xfe, 0x7b, 0x00, 0x7d, 0x00]) },
);

/** A valid body of the route with one field broken, dropped, or a pollution key added. */
function mutated(valid: Record<string, unknown>): fc.Arbitrary<Raw> {
  const keys = Object.keys(valid);
  const broken = keys.length === 0 ? fc.constant(valid) : fc.tuple(fc.constantFrom(...keys), weird).map(([key, value]) => ({ ...valid, [key]: value }));
  const dropped = keys.length === 0 ? fc.constant(valid) : fc.constantFrom(...keys).map((key) => Object.fromEntries(Object.entries(valid).filter(([k]) => k !== key)));
  const polluted = fc.constantFrom('__proto__', 'constructor', 'prototype').map((key) => `{"${key}":{"polluted":true},${JSON.stringify(valid).slice(1)}`);
  return fc.oneof(
    broken.map((body) => ({ text: JSON.stringify(body) })),
    dropped.map((body) => ({ text: JSON.stringify(body) })),
    fc.constant({ text: JSON.stringify([valid]) }),
    polluted.map((text) => ({ text: text.endsWith(',}') ? `${text.slice(0, -2)}}` : text })),
  );
}

function bodies(spec: RouteSpec): fc.Arbitrary<Raw> {
  const valid = (validInput(spec, fixture)?.body ?? {}) as Record<string, unknown>;
  return fc.oneof(
    { arbitrary: fc.jsonValue({ maxDepth: 4 }).map((value) => ({ text: JSON.stringify(value) ?? '' })), weight: 2 },
    { arbitrary: fc.dictionary(fc.string({ maxLength: 12 }), weird, { maxKeys: 6 }).map((value) => ({ text: JSON.stringify(value) })), weight: 2 },
    { arbitrary: mutated(valid), weight: 3 },
    { arbitrary: deepNesting, weight: 1 },
    { arbitrary: notJson, weight: 2 },
  );
}

/** What the route's validation makes of a raw body, as the server would see it: refused, or accepted. */
function acceptedByRoute(spec: RouteSpec, raw: Raw): boolean {
  const text = 'text' in raw ? raw.text : raw.bytes.toString('utf8');
  let value: unknown = {};
  if (text.trim() !== '') {
    // express.json is strict: only an object or an array at the top.
    if (!/^[\s\uFEFF]*[[{]/.test(text)) return false;
    try {
      value = JSON.parse(text.replace(/^\uFEFF/, ''));
    } catch {
      return false;
    }
  }
  if (!spec.body) return true;
  return spec.body.safeParse(value ?? {}).success;
}

/** Raw bytes under application/json, with the administrator's CSRF token. */
function sendRaw(session: Session, spec: RouteSpec, path: string, raw: Raw) {
  return send(session, spec.method, path)
    .set('Content-Type', 'application/json')
    .send('text' in raw ? raw.text : raw.bytes);
}

// ---------------------------------------------------------------------------------------------
// Random files

const fileBytes = fc.oneof(
  fc.uint8Array({ maxLength: 4096 }).map((bytes) => Buffer.from(bytes)),
  fc.string({ unit: 'binary', maxLength: 2000 }).map((text) => Buffer.from(text, 'utf8')),
  // Known magic numbers followed by garbage: accepted as that type where the route takes it.
  fc.tuple(
    fc.constantFrom([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a], [0xff, 0xd8, 0xff], [0x25, 0x50, 0x44, 0x46, 0x2d], [0x50, 0x4b, 0x03, 0x04], [0xd0, 0xcf, 0x11, 0xe0, 0xa1, 0xb1, 0x1a, 0xe1]),
    fc.uint8Array({ maxLength: 2048 }),
  ).map(([magic, rest]) => Buffer.concat([Buffer.from(magic), Buffer.from(rest)])),
  fc.constantFrom(Buffer.alloc(0), Buffer.from('timestamp,Power [kW]\n2026-13-45 25:00,abc\n'), Buffer.from('Tag,Rated power [kW]\n=cmd|x,NaN\n')),
);
const fieldValue = fc.oneof(
  fc.constantFrom('document', 'photo', 'nameplate-photo', 'baseline', 'reporting', 'kW', 'kWh', 'interval', 'cumulative', 'motor', 'feeder', '', '__proto__'),
  nanIsh,
  fc.string({ maxLength: 30 }),
  fc.constantFrom('{"Tag":"tag"}', '{"__proto__":{"x":1}}', '[', 'x'.repeat(150_000)),
);
const uploads = fc.record({
  fields: fc.dictionary(fc.constantFrom('kind', 'period', 'unit', 'register', 'scope', 'siteId', 'mapping', '__proto__', 'file'), fieldValue, { maxKeys: 5 }),
  file: fc.option(fileBytes, { nil: undefined }),
  fileName: fc.constantFrom('x.png', '../../etc/passwd', 'a.csv', 'ü "q".pdf', ''),
  siteIdOf: fc.constantFrom('real', 'missing', 'none'),
});

describe('fuzzing the write routes', () => {
  it('answers random and malformed JSON on every write route with a 4xx and changes nothing', async () => {
    const admin = fixture.sessions.admin;
    const writes = registeredRoutes.filter((spec) => isWrite(spec) && !isUpload(spec));
    expect(writes.length).toBeGreaterThan(30);
    let requests = 0;
    let skipped = 0;
    for (const spec of writes) {
      // A route that ignores its body (no schema, no id to send to a missing row) ends the session
      // of whoever calls it (sign-out): fuzz it on a session of its own.
      const ownSession = !spec.body && pathParams(spec.path).length === 0;
      const session = ownSession ? await signIn(context.app, await createUser(fixture.organization, 'viewer')) : admin;
      const before = await databaseSnapshot(NOT_DATA);
      await fc.assert(
        fc.asyncProperty(bodies(spec), async (raw) => {
          const accepted = acceptedByRoute(spec, raw);
          // Input the route accepts would change data legitimately; it goes to a missing row instead,
          // or is not sent when the route has no row to point at.
          if (accepted && pathParams(spec.path).length === 0 && !ownSession) {
            skipped += 1;
            return;
          }
          const path = fillPath(spec.path, (resource) => (accepted ? MISSING : fixture.ids[resource]));
          const response = await sendRaw(session, spec, path, raw);
          requests += 1;
          expect(response.status, `${routeKey(spec)} ${JSON.stringify(response.body).slice(0, 200)}`).toBeLessThan(500);
          if (!ownSession) expect(response.status, `${routeKey(spec)}: accepted ${JSON.stringify(response.body).slice(0, 200)}`).toBeGreaterThanOrEqual(400);
        }),
        { seed: SEED, numRuns: RUNS_PER_ROUTE, endOnFailure: true },
      );
      await jobsSettled();
      expect(await databaseSnapshot(NOT_DATA), `${routeKey(spec)} changed the database`).toEqual(before);
    }
    console.info(`fuzz JSON: ${writes.length} write routes × ${RUNS_PER_ROUTE} runs: ${requests} requests, ${skipped} generated bodies valid for a route without an id (not sent)`);
  }, 120_000);

  it('answers random files and form fields on every upload route without a 5xx; a refused upload changes nothing', async () => {
    const admin = fixture.sessions.admin;
    const routes = registeredRoutes.filter(isUpload);
    expect(routes.map(routeKey).sort()).toEqual(['POST /imports', 'POST /motors/:id/files', 'POST /retrofits/:id/files', 'POST /retrofits/:id/meter-data']);
    let accepted = 0;
    let refused = 0;
    for (const spec of routes) {
      let before = await databaseSnapshot(NOT_DATA);
      await fc.assert(
        fc.asyncProperty(uploads, async (upload) => {
          let test = send(admin, spec.method, fillPath(spec.path, (resource) => fixture.ids[resource]));
          const fields = { ...upload.fields };
          if (upload.siteIdOf === 'real') fields.siteId = String(fixture.ids.site);
          if (upload.siteIdOf === 'missing') fields.siteId = String(MISSING);
          for (const [name, value] of Object.entries(fields)) test = test.field(name, value);
          if (upload.file) test = test.attach('file', upload.file, upload.fileName === '' ? 'file' : upload.fileName);
          const response = await test;
          expect(response.status, `${routeKey(spec)} ${JSON.stringify(response.body).slice(0, 200)}`).toBeLessThan(500);
          await jobsSettled();
          const after = await databaseSnapshot(NOT_DATA);
          if (response.status >= 400) {
            refused += 1;
            expect(after, `${routeKey(spec)}: refused (${response.status}) but changed the database`).toEqual(before);
          } else accepted += 1;
          before = after;
        }),
        { seed: SEED, numRuns: RUNS_PER_ROUTE, endOnFailure: true },
      );
    }
    console.info(`fuzz files: ${routes.length} upload routes × ${RUNS_PER_ROUTE} runs: ${refused} refused (database unchanged), ${accepted} accepted`);
  }, 120_000);
});
