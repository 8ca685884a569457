/**
 * Shared by the security tests (route matrix, organisation isolation, fuzz): an organisation with a
 * row of every kind the API serves, made through the API where it is cheap (so the rows are what a
 * user would create) and straight in the tables where the API would need slow or asynchronous work
 * (outbox attachments). Every text a list could show carries the organisation's marker, so a test
 * can tell from any answer whether another organisation's data leaked into it.
 */
import { randomBytes } from 'node:crypto';
import { expect } from 'vitest';
import type { RouteSpec } from '../../server/lib/routing.js';
import { OutboxAttachment, OutboxMessage, type Organization, type Site, type User, type Motor } from '../../server/models/index.js';
import { database } from '../../server/lib/database.js';
import { ROLES, type Role } from '../../server/shared/roles.js';
import { createOrganization, createSite, createUser, signIn, waitForMail, type TestContext } from './api.js';
import { createMotor } from './retrofits.js';

export type Session = Awaited<ReturnType<typeof signIn>>;

/** The kinds of row a route path parameter can name. */
export type Resource =
  | 'site'
  | 'motor'
  | 'motorFile'
  | 'import'
  | 'study'
  | 'design'
  | 'case'
  | 'retrofit'
  | 'retrofitFile'
  | 'job'
  | 'material'
  | 'outboxMessage'
  | 'outboxAttachment'
  | 'user';

export interface OrgFixture {
  marker: string;
  organization: Organization;
  site: Site;
  motor: Motor;
  users: Record<Role, User>;
  sessions: Record<Role, Session>;
  ids: Record<Resource, number>;
  /** Ids of rows that no route names by id but that belong to the organisation (measurements, meter data). */
  measurementId: number;
}

/** Smallest bytes that the upload type sniffing takes for a PNG. */
export const PNG = Buffer.concat([Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]), Buffer.alloc(64, 7)]);

/** The README's size-bldc example (tests/api/designs.test.ts): feasible and quick. */
export const SIZE_INPUT = { ratedPowerKw: 4, speedRpm: 1500, supplyVoltageV: 400, frequencyHz: 50, slots: 18, poles: 12, objective: 'efficiency' };

export const ASSESS_INPUT = {
  motor: { tag: 'AHU-3 supply fan', application: 'fan', ratedPowerKw: 15, poles: 4, efficiencyClass: 'IE1', controlMethod: 'outlet-damper', hoursPerYear: 6000, loadFactor: 0.8 },
  site: { name: 'Chiller plant', voltageV: 400, frequencyHz: 50, energyPricePerKwh: 0.18, demandChargePerKwMonth: 6, currency: 'EUR', co2KgPerKwh: 0.3 },
};

export const CUSTOM_MAGNET = {
  kind: 'magnet',
  family: 'sintered-ndfeb',
  remanenceT: 1.26,
  intrinsicCoercivityAPerM: 1_100_000,
  remanenceTempCoeffPerK: -0.0012,
  coercivityTempCoeffPerK: -0.006,
  recoilPermeability: 1.05,
  maxTemperatureC: 100,
  densityKgPerM3: 7500,
  conductivitySPerM: 670_000,
  pricePerKg: 48,
};

/** Baseline meter data: two days of hourly mean power. */
export function meterCsv(): string {
  const lines = ['timestamp,Power [kW]'];
  for (let hour = 0; hour < 48; hour += 1) lines.push(`2026-03-${String(2 + Math.floor(hour / 24)).padStart(2, '0')} ${String(hour % 24).padStart(2, '0')}:00,${hour % 24 < 12 ? 20 : 0.5}`);
  return lines.join('\n');
}

async function created(response: import('supertest').Response, what: string): Promise<Record<string, unknown>> {
  expect(response.status, `${what}: ${JSON.stringify(response.body)}`).toBeLessThan(300);
  return response.body as Record<string, unknown>;
}

/** An organisation with one row of every kind, its four users signed in. */
export async function populateOrganization(context: TestContext, label: string): Promise<OrgFixture> {
  const marker = `zq${label}${randomBytes(3).toString('hex')}`;
  const organization = await createOrganization(`${marker} Works`);
  const users = {} as Record<Role, User>;
  const sessions = {} as Record<Role, Session>;
  for (const role of ROLES) {
    users[role] = await createUser(organization, role, { email: `${role}-${marker}@test.example` });
    sessions[role] = await signIn(context.app, users[role]);
  }
  const admin = sessions.admin;
  const site = await createSite(organization, { name: `${marker} pump house` });
  const motor = await createMotor(organization, site, { tag: `${marker}-M1`, description: `${marker} motor`, manufacturer: null });

  const measurement = await created(await admin.post(`/api/motors/${motor.id}/measurements`).send({ measuredAt: '2026-01-05', inputPowerKw: 12, note: `${marker} reading` }), 'measurement');
  const motorFile = await created(
    await admin.post(`/api/motors/${motor.id}/files`).field('kind', 'nameplate-photo').attach('file', PNG, { filename: `${marker}-plate.png`, contentType: 'image/png' }),
    'motor file',
  );
  const batch = await created(
    await admin
      .post('/api/imports')
      .field('siteId', String(site.id))
      .attach('file', Buffer.from(`Tag,Rated power [kW],Poles\n${marker}-I1,7.5,4\n`), { filename: `${marker}-motors.csv`, contentType: 'text/csv' }),
    'import',
  );
  const study = await created(await admin.post('/api/studies').send({ ...ASSESS_INPUT, name: `${marker} study`, motorId: motor.id }), 'study');
  const design = await created(await admin.post('/api/designs').send({ ...SIZE_INPUT, name: `${marker} design`, motorId: motor.id }), 'design');
  const businessCase = await created(await admin.post('/api/cases').send({ siteId: site.id }), 'case');
  const retrofit = await created(await admin.post('/api/retrofits').send({ motorId: motor.id, optionCode: 'ie4', comment: `${marker} proposal`, notes: `${marker} notes` }), 'retrofit');
  await created(
    await admin
      .post(`/api/retrofits/${retrofit.id as number}/meter-data`)
      .field('period', 'baseline')
      .attach('file', Buffer.from(meterCsv()), { filename: `${marker}-baseline.csv`, contentType: 'text/csv' }),
    'meter data',
  );
  const retrofitFile = await created(
    await admin.post(`/api/retrofits/${retrofit.id as number}/files`).field('kind', 'photo').attach('file', PNG, { filename: `${marker}-site.png`, contentType: 'image/png' }),
    'retrofit file',
  );
  const job = await created(await admin.post(`/api/sites/${site.id}/screening`).send({}), 'screening job');
  const material = await created(await admin.post('/api/settings/materials').send({ ...CUSTOM_MAGNET, name: `${marker} N40` }), 'material');
  await created(await admin.agent.put('/api/settings/assumptions').set('x-csrf-token', admin.token).send({ discountRatePct: 9, version: 0 }), 'assumptions');
  const invited = await created(await admin.post('/api/users/invitations').send({ email: `invitee-${marker}@test.example`, name: `${marker} invitee`, role: 'viewer' }), 'invitation');
  // The invitation e-mail reaches the Outbox through SMTP; wait for it so it cannot arrive mid-test.
  await waitForMail((message) => message.toAddresses.includes(`invitee-${marker}@test.example`));
  const message = await OutboxMessage.create({
    organizationId: organization.id,
    messageId: null,
    fromAddress: 'statorline@test.example',
    toAddresses: [`finance-${marker}@test.example`],
    subject: `${marker} business case`,
    textBody: `${marker} attached`,
    htmlBody: null,
    headers: {},
    receivedAt: new Date(),
  });
  const attachment = await OutboxAttachment.create({ messageId: message.id, filename: `${marker}.pdf`, contentType: 'application/pdf', sizeBytes: 9, content: Buffer.from('%PDF-1.4\n') });

  return {
    marker,
    organization,
    site,
    motor,
    users,
    sessions,
    measurementId: measurement.id as number,
    ids: {
      site: site.id,
      motor: motor.id,
      motorFile: motorFile.id as number,
      import: batch.id as number,
      study: study.id as number,
      design: design.id as number,
      case: businessCase.id as number,
      retrofit: retrofit.id as number,
      retrofitFile: retrofitFile.id as number,
      job: (job as { jobId: number }).jobId,
      material: material.id as number,
      outboxMessage: message.id,
      outboxAttachment: attachment.id,
      user: invited.id as number,
    },
  };
}

/** What a path parameter names: by its name, then by the first segment of the path. */
export function resourceOf(path: string, param: string): Resource {
  const first = path.split('/')[1];
  if (param === 'fileId') return first === 'motors' ? 'motorFile' : first === 'retrofits' ? 'retrofitFile' : unknownParam(path, param);
  if (param === 'attachmentId') return 'outboxAttachment';
  if (param === 'jobId') return 'job';
  if (param === 'motorId') return 'motor';
  if (param !== 'id') return unknownParam(path, param);
  const byFirstSegment: Record<string, Resource> = {
    sites: 'site',
    motors: 'motor',
    imports: 'import',
    studies: 'study',
    designs: 'design',
    cases: 'case',
    retrofits: 'retrofit',
    jobs: 'job',
    settings: 'material',
    outbox: 'outboxMessage',
    users: 'user',
  };
  return byFirstSegment[first ?? ''] ?? unknownParam(path, param);
}

function unknownParam(path: string, param: string): never {
  throw new Error(`${path}: no fixture row for the parameter :${param}; add the resource to tests/support/security.ts`);
}

/** The names of a path's parameters (`/motors/:id/files/:fileId` → id, fileId). */
export function pathParams(path: string): string[] {
  return [...path.matchAll(/:(\w+)/g)].map((match) => match[1]!);
}

/** The path with every parameter replaced by the id `idOf` gives. */
export function fillPath(path: string, idOf: (resource: Resource) => number): string {
  return path.replace(/:(\w+)/g, (_whole, param: string) => String(idOf(resourceOf(path, param))));
}

export const routeKey = (spec: Pick<RouteSpec, 'method' | 'path'>) => `${spec.method.toUpperCase()} ${spec.path}`;

export const isWrite = (spec: Pick<RouteSpec, 'method'>) => spec.method !== 'get';

/** A supertest request of `spec`'s method on `path` through the session's agent, with or without its CSRF token. */
export function send(session: { agent: import('supertest').Agent; token?: string }, method: RouteSpec['method'], path: string, csrf = true) {
  const test = session.agent[method](`/api${path}`);
  if (csrf && session.token && method !== 'get') test.set('x-csrf-token', session.token);
  return test;
}

/** A multipart upload: text fields and one file. */
export interface Upload {
  fields: Record<string, string>;
  file: Buffer;
  fileName: string;
}

/**
 * A request each write route accepts in shape (it passes the route's validation), so that what
 * answers is the handler: the isolation test needs it to reach the organisation check. `f` is the
 * organisation whose rows the body may name. A write route missing here is sent `{}`.
 */
export function validInput(spec: Pick<RouteSpec, 'method' | 'path'>, f: OrgFixture): { body?: unknown; query?: string; upload?: Upload } | undefined {
  const inputs: Record<string, { body?: unknown; query?: string; upload?: Upload }> = {
    'GET /cases/:id/export': { query: 'format=xlsx' },
    'POST /cases/:id/send': { body: { message: 'Please review' } },
    'POST /cases/:id/decision': { body: { decision: 'approved' } },
    'POST /designs/:id/simulate': { body: { load: { kind: 'constant', torqueNm: 1 }, durationS: 0.01 } },
    'POST /designs/:id/efficiency-map': { body: { speedsRpm: [1000], torquesNm: [1] } },
    'POST /motors/:id/design': { body: { designId: null } },
    'PATCH /motors/:id': { body: { version: f.motor.version, description: 'changed' } },
    'POST /motors/:id/measurements': { body: { measuredAt: '2026-01-06', inputPowerKw: 5 } },
    'POST /motors/:id/files': { upload: { fields: { kind: 'document' }, file: PNG, fileName: 'plate.png' } },
    'PUT /imports/:id/mapping': { body: { mapping: { Tag: 'tag' } } },
    'PATCH /retrofits/:id': { body: { version: 0, notes: 'changed' } },
    'POST /retrofits/:id/meter-data': { upload: { fields: { period: 'baseline' }, file: Buffer.from(meterCsv()), fileName: 'baseline.csv' } },
    'POST /retrofits/:id/files': { upload: { fields: { kind: 'photo' }, file: PNG, fileName: 'site.png' } },
    'POST /sites/:id/screening': { body: {} },
    'PATCH /sites/:id': { body: { version: f.site.version, name: 'renamed' } },
    'POST /screenings/:jobId/proposals': { body: { motorIds: [f.ids.motor] } },
    'PATCH /settings/materials/:id': { body: { version: 0, pricePerKg: 50 } },
    'PATCH /users/:id': { body: { version: 0, role: 'engineer' } },
  };
  return inputs[routeKey(spec)];
}

/** Sends `spec` on `path` with `input` (JSON body, query string or multipart upload). */
export function sendInput(session: Session, spec: Pick<RouteSpec, 'method'>, path: string, input: ReturnType<typeof validInput>) {
  let test = send(session, spec.method, input?.query ? `${path}?${input.query}` : path);
  if (input?.upload) {
    for (const [name, value] of Object.entries(input.upload.fields)) test = test.field(name, value);
    return test.attach('file', input.upload.file, input.upload.fileName);
  }
  if (spec.method !== 'get') test = test.send((input?.body ?? {}) as object);
  return test;
}

/** Waits until no background job is queued or running (the job runner writes to the jobs table). */
export async function jobsSettled(timeoutMs = 30_000): Promise<void> {
  const deadline = Date.now() + timeoutMs;
  while (Date.now() < deadline) {
    const [rows] = await database().query(`SELECT count(*)::int AS busy FROM jobs WHERE status IN ('queued', 'running')`);
    if ((rows as { busy: number }[])[0]!.busy === 0) return;
    await new Promise((resolve) => setTimeout(resolve, 100));
  }
  throw new Error('background jobs did not finish');
}

/**
 * Row count and md5 of the rows of every table of the schema, but `excluded`: one query, so the
 * picture is consistent. Rows are hashed in their text form sorted, so the order of storage does not matter.
 */
export async function databaseSnapshot(excluded: readonly string[]): Promise<Record<string, string>> {
  const [tables] = await database().query(`SELECT tablename AS name FROM pg_tables WHERE schemaname = 'public' ORDER BY tablename`);
  const names = (tables as { name: string }[]).map((row) => row.name).filter((name) => !excluded.includes(name));
  const parts = names.map(
    (name) => `SELECT '${name}' AS name, count(*) || ':' || coalesce(md5(string_agg(t::text, '|' ORDER BY t::text)), '') AS digest FROM "${name}" t`,
  );
  const [rows] = await database().query(parts.join(' UNION ALL '));
  return Object.fromEntries((rows as { name: string; digest: string }[]).map((row) => [row.name, row.digest]));
}
