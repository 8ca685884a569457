/**
 * The route-by-role matrix (issue 10, security): every route of `registeredRoutes` — filled when the
 * app mounts, so a route added anywhere is walked here without editing this file — is called with no
 * session and as each role, and the status must follow the route's own `access` declaration.
 * Path parameters name rows of the caller's organisation (tests/support/security.ts); a route whose
 * parameter has no fixture row fails the test until one is added.
 */
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { registeredRoutes, type RouteSpec } from '../../server/lib/routing.js';
import { setUploadDir } from '../../server/lib/uploads.js';
import { ROLES, type Role } from '../../server/shared/roles.js';
import { signIn, startTestApp, type TestContext } from '../support/api.js';
import { fillPath, isWrite, populateOrganization, routeKey, send, type OrgFixture } from '../support/security.js';
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';

type Caller = 'anonymous' | Role;
const CALLERS: readonly Caller[] = ['anonymous', ...ROLES];

let context: TestContext;
let fixture: OrgFixture;
let uploadDir: string;
/** An anonymous session: it has a CSRF token (GET /api/auth/csrf) but nobody signed in. */
let anonymous: { agent: request.Agent; token: string };

beforeAll(async () => {
  uploadDir = mkdtempSync(join(tmpdir(), 'statorline-matrix-'));
  setUploadDir(uploadDir);
  // Enough sign-in attempts for the matrix's own POST /auth/login calls on top of the fixture's.
  context = await startTestApp({ signInAttemptsPerWindow: 1000 });
  fixture = await populateOrganization(context, 'a');
  const agent = request.agent(context.app);
  const csrf = await agent.get('/api/auth/csrf').expect(200);
  anonymous = { agent, token: csrf.body.token as string };
}, 120_000);
afterAll(async () => {
  await context.close();
  rmSync(uploadDir, { recursive: true, force: true });
});

/** What a caller may expect of a route by its declaration alone. */
function expected(spec: RouteSpec, caller: Caller): 'allowed' | 401 | 403 {
  if (spec.access === 'public') return 'allowed';
  if (caller === 'anonymous') return 401;
  if (spec.access === 'signed-in') return 'allowed';
  return spec.access.includes(caller) ? 'allowed' : 403;
}

/**
 * Sign-out (of this session, or of all the user's sessions) ends the caller's session, so those
 * routes are walked last; every other route keeps the mounting order (a write that succeeds, such
 * as a discarded import, only changes later answers to 404 or 409).
 */
const endsSession = (spec: RouteSpec) => spec.method === 'post' && spec.path.startsWith('/auth/logout');
function walkOrder(routes: RouteSpec[]): RouteSpec[] {
  const last = (spec: RouteSpec) => (endsSession(spec) ? 1 : 0);
  return [...routes].sort((a, b) => last(a) - last(b));
}

async function freshSession(caller: Caller): Promise<{ agent: request.Agent; token: string }> {
  if (caller !== 'anonymous') return signIn(context.app, fixture.users[caller]);
  const agent = request.agent(context.app);
  const csrf = await agent.get('/api/auth/csrf').expect(200);
  return { agent, token: csrf.body.token as string };
}

describe('route-by-role matrix', () => {
  // The CSRF walk first: the matrix ends with each caller signing out.
  it('refuses every state-changing route without a valid CSRF token (403 csrf), signed in or not', async () => {
    const writes = registeredRoutes.filter(isWrite);
    expect(writes.length).toBeGreaterThan(30);
    const admin = fixture.sessions.admin;
    const problems: string[] = [];
    for (const spec of writes) {
      const path = fillPath(spec.path, (resource) => fixture.ids[resource]);
      const attempts = [
        { label: 'admin, no token', test: send(admin, spec.method, path, false) },
        { label: 'admin, wrong token', test: send(admin, spec.method, path, false).set('x-csrf-token', `${admin.token.slice(0, -2)}xx`) },
        { label: 'admin, another session’s token', test: send(admin, spec.method, path, false).set('x-csrf-token', anonymous.token) },
        { label: 'no cookie at all', test: request(context.app)[spec.method](`/api${path}`).set('x-csrf-token', admin.token) },
      ];
      for (const { label, test } of attempts) {
        const response = await test.send({});
        if (response.status !== 403 || response.body?.error?.code !== 'csrf') problems.push(`${label} ${spec.method.toUpperCase()} ${path}: ${response.status} ${JSON.stringify(response.body)}`);
      }
    }
    expect(problems).toEqual([]);
    // The admin's session is still good afterwards: the refusals did not end it.
    await admin.get('/api/auth/me').expect(200);
    console.info(`CSRF: ${writes.length} state-changing routes × 4 tokenless or foreign-token requests refused`);
  }, 60_000);

  it('answers every route for no session and each role as its access declaration says', async () => {
    const routes = registeredRoutes;
    const keys = new Set(routes.map(routeKey));
    // Mounted once: a duplicate would mean two handlers for one method and path.
    expect(keys.size).toBe(routes.length);
    expect(routes.length).toBeGreaterThan(60);

    const walked = new Map<string, Set<Caller>>();
    const problems: string[] = [];
    const statuses = new Map<number, number>();
    for (const caller of CALLERS) {
      const session = caller === 'anonymous' ? anonymous : fixture.sessions[caller];
      for (const spec of walkOrder(routes)) {
        const path = fillPath(spec.path, (resource) => fixture.ids[resource]);
        // A sign-out route gets a session of its own, so one sign-out cannot hide the next.
        const caller_ = endsSession(spec) ? await freshSession(caller) : session;
        let test = send(caller_, spec.method, path);
        if (isWrite(spec)) test = test.send({});
        const response = await test;
        const want = expected(spec, caller);
        const got = response.status;
        statuses.set(got, (statuses.get(got) ?? 0) + 1);
        const ok = want === 'allowed' ? got !== 401 && got !== 403 && got < 500 : got === want;
        if (!ok) problems.push(`${caller} ${spec.method.toUpperCase()} ${path}: expected ${want}, got ${got} ${JSON.stringify(response.body?.error ?? '')}`);
        if (!walked.has(routeKey(spec))) walked.set(routeKey(spec), new Set());
        walked.get(routeKey(spec))!.add(caller);
      }
    }
    expect(problems).toEqual([]);
    // Every declared route, for every caller: a route added later cannot escape the matrix.
    expect([...walked.keys()].sort()).toEqual([...keys].sort());
    for (const [key, callers] of walked) expect([...callers].sort(), key).toEqual([...CALLERS].sort());
    const calls = [...walked.values()].reduce((sum, callers) => sum + callers.size, 0);
    expect(calls).toBe(routes.length * CALLERS.length);
    const histogram = [...statuses].sort(([a], [b]) => a - b).map(([status, count]) => `${status}×${count}`).join(' ');
    console.info(`route matrix: ${routes.length} routes × ${CALLERS.length} callers = ${calls} requests; statuses ${histogram}`);
  }, 120_000);
});
