/**
 * PostgreSQL stopped and started again under a running app (issue 10, faults). The file runs its own
 * throwaway cluster (the shared test cluster is never stopped): while it is down every request that
 * needs it answers 503 'unavailable' at once and the health route says so; an import commit cut off
 * in the middle leaves nothing; once PostgreSQL is back the same app (no restart) answers again,
 * the session survives, and the interrupted commit can be committed again in full.
 */
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import pg from 'pg';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createApp } from '../../server/app.js';
import { startJobs, stopJobs } from '../../server/jobs/index.js';
import { loadConfig } from '../../server/lib/config.js';
import { connectDatabase, database } from '../../server/lib/database.js';
import { setLogLevel } from '../../server/lib/logger.js';
import { startMailCatcher, type MailCatcher } from '../../server/lib/mail-catcher.js';
import { createMailer, type Mailer } from '../../server/lib/mail.js';
import { migrator } from '../../server/lib/migrator.js';
import { startCluster, type RunningCluster } from '../../server/lib/postgres-cluster.js';
import { setUploadDir } from '../../server/lib/uploads.js';
import { AuditLog, ImportBatch, Motor, Site, type Organization, type User } from '../../server/models/index.js';
import { createOrganization, createSite, createUser, signIn } from '../support/api.js';

const DATABASE = 'statorline_outage';
/** Rows of the import cut off by the outage: three commit chunks of 2,000. */
const IMPORT_ROWS = 6000;
/** Longer than this for a 503 would be a hang, not an answer [ms]. */
const ANSWER_BOUND_MS = 15_000;

let dataDir: string;
let port: number;
let cluster: RunningCluster;
let url: string;
let app: ReturnType<typeof createApp>['app'];
let closeApp: () => Promise<void>;
let catcher: MailCatcher;
let mailer: Mailer;
let organization: Organization;
let user: User;
let site: Site;
let holder: pg.Client | undefined;

const startOwnCluster = () => startCluster({ dataDir, port, throwaway: true });

function motorsCsv(rows: number): Buffer {
  const lines = ['Tag,Rated power (kW),Poles,Application'];
  for (let index = 1; index <= rows; index += 1) lines.push(`OUT-${String(index).padStart(5, '0')},${[4, 7.5, 15, 30][index % 4]},4,pump`);
  return Buffer.from(`${lines.join('\n')}\n`);
}

async function until<T>(what: string, probe: () => Promise<T | undefined>, timeoutMs = 30_000): Promise<T> {
  const deadline = Date.now() + timeoutMs;
  while (Date.now() < deadline) {
    const value = await probe();
    if (value !== undefined) return value;
    await new Promise((resolve) => setTimeout(resolve, 50));
  }
  throw new Error(`timed out waiting for ${what}`);
}

beforeAll(async () => {
  setLogLevel('silent');
  dataDir = mkdtempSync(join(tmpdir(), 'statorline-outage-'));
  port = 61000 + Math.floor(Math.random() * 4000);
  cluster = await startOwnCluster();
  await cluster.ensureDatabase(DATABASE);
  url = cluster.url(DATABASE);
  connectDatabase(url, { poolMax: 5 });
  await migrator(database()).up();
  setUploadDir(join(dataDir, 'uploads'));
  catcher = await startMailCatcher(0);
  const config = { ...loadConfig({ NODE_ENV: 'test', SESSION_SECRET: 'test-secret-test-secret' }), publicUrl: 'http://127.0.0.1:3000' };
  mailer = createMailer({ catcherPort: catcher.port, from: config.mailFrom });
  ({ app, close: closeApp } = createApp({ config, databaseUrl: url, mailer }));
  await startJobs({ pollMs: 500 });
  organization = await createOrganization();
  user = await createUser(organization, 'engineer');
  site = await createSite(organization, { name: 'Outage site' });
}, 120_000);

afterAll(async () => {
  // A failed run may leave the holder's lock in place, and the commit waiting on it.
  await holder?.end().catch(() => undefined);
  await stopJobs();
  mailer?.close();
  await catcher?.close();
  await closeApp?.();
  await database().close();
  await cluster?.stop();
  if (dataDir) rmSync(dataDir, { recursive: true, force: true });
});

describe('PostgreSQL stopped and started under the running server', () => {
  it('answers 503 while it is down, recovers by itself, and leaves no half-written commit', async () => {
    const session = await signIn(app, user);
    expect((await request(app).get('/api/health').expect(200)).body).toEqual({ status: 'ok', database: 'up' });

    const preview = await session.post('/api/imports').field('siteId', String(site.id)).attach('file', motorsCsv(IMPORT_ROWS), 'outage.csv').expect(201);
    expect(preview.body.rows).toMatchObject({ total: IMPORT_ROWS, valid: IMPORT_ROWS });
    const batchId = preview.body.id as number;

    // Hold the audit table, then start the commit: its first chunk of motors is written and it waits
    // on the chunk's audit rows, inside its open transaction — a commit in the middle of its work.
    const locker = new pg.Client({ connectionString: url });
    holder = locker;
    locker.on('error', () => undefined);
    await locker.connect();
    await locker.query('BEGIN');
    await locker.query('LOCK TABLE audit_logs IN SHARE MODE');
    const commit = session.post(`/api/imports/${batchId}/commit`).then((response) => response);
    await until('the commit waiting in the middle of its transaction', async () => {
      const waiting = await locker.query(
        `SELECT 1 FROM pg_locks l JOIN pg_class c ON c.oid = l.relation JOIN pg_stat_activity a ON a.pid = l.pid
         WHERE NOT l.granted AND c.relname = 'audit_logs' AND a.application_name = 'statorline'`,
      );
      return waiting.rowCount ? true : undefined;
    }, 60_000);
    expect((await locker.query<{ status: string }>('SELECT status FROM import_batches WHERE id = $1', [batchId])).rows[0]?.status).toBe('committing');

    await cluster.stop();
    const downAt = Date.now();

    // Down: a signed-in read (its session is in PostgreSQL), the health route, a write — all 503 at once.
    const read = await session.get('/api/sites');
    const firstAnswerMs = Date.now() - downAt;
    expect(read.status).toBe(503);
    expect(read.body.error).toMatchObject({ code: 'unavailable', message: 'The database is not answering; try again in a moment.' });
    const health = await request(app).get('/api/health');
    expect(health.status).toBe(503);
    expect(health.body).toEqual({ status: 'degraded', database: 'down' });
    const write = await session.post('/api/sites').send({ name: 'Written during the outage', voltageV: 400, frequencyHz: 50, energyPricePerKwh: 0.15, currency: 'EUR' });
    expect(write.status).toBe(503);
    expect(write.body.error.code).toBe('unavailable');
    const cut = await commit;
    expect(cut.status).toBe(503);
    expect(cut.body.error).toMatchObject({ code: 'unavailable', message: 'The database stopped answering during the commit; nothing was written. Commit again once it is back.' });
    const slowestDownMs = Date.now() - downAt;
    expect(slowestDownMs).toBeLessThan(ANSWER_BOUND_MS);
    await locker.end().catch(() => undefined);

    // Up again: the same app answers, without a restart, with the same session.
    cluster = await startOwnCluster();
    const upAt = Date.now();
    await until('the health route to answer 200', async () => ((await request(app).get('/api/health')).status === 200 ? true : undefined));
    const recoveryMs = Date.now() - upAt;
    const sites = await session.get('/api/sites').expect(200);
    expect(JSON.stringify(sites.body)).not.toContain('Written during the outage');
    expect(await Site.count({ where: { name: 'Written during the outage' } })).toBe(0);

    // The cut commit wrote nothing; the batch can be committed again, and then holds every row.
    expect(await Motor.count({ where: { siteId: site.id } })).toBe(0);
    expect(await AuditLog.count({ where: { organizationId: organization.id, action: 'import-create' } })).toBe(0);
    const again = await session.post(`/api/imports/${batchId}/commit`).expect(200);
    expect(again.body).toEqual({ created: IMPORT_ROWS, updated: 0, skipped: 0 });
    expect(await Motor.count({ where: { siteId: site.id } })).toBe(IMPORT_ROWS);
    expect(await ImportBatch.findByPk(batchId)).toMatchObject({ status: 'committed', progress: 1, createdCount: IMPORT_ROWS });

    console.info(`database outage: first 503 after ${firstAnswerMs} ms, every request answered within ${slowestDownMs} ms of the stop; health 200 again ${recoveryMs} ms after PostgreSQL was up`);
  }, 90_000);
});
