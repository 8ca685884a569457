/**
 * The real server (`node --import tsx server/cli/start.ts`) as a child process on a database of its
 * own (issue 10, faults):
 * - killed (SIGKILL) in the middle of an import commit, of a business-case generation and of a
 *   screening job: after a restart the database holds none of the cut work, the import can be
 *   committed again in full, and the job is re-queued and run again;
 * - stopped by SIGTERM with a request in flight: the request still completes with 2xx, new connections
 *   are refused, the running job goes back to the queue, the process logs "stopped cleanly" and exits 0.
 *
 * "In the middle" is made certain, not left to timing: the import is killed once its progress row
 * shows a written step and its transaction waits on the audit table, which the test holds locked; the
 * business case once its row is inserted and its transaction waits on that table too.
 */
import { spawn, type ChildProcess } from 'node:child_process';
import { randomBytes } from 'node:crypto';
import { mkdirSync, mkdtempSync, rmSync, utimesSync, writeFileSync } from 'node:fs';
import { connect, createServer } from 'node:net';
import { tmpdir } from 'node:os';
import { join, relative } from 'node:path';
import pg from 'pg';
import request from 'supertest';
import { afterAll, afterEach, beforeAll, describe, expect, it, inject } from 'vitest';
import { projectRoot } from '../../server/lib/config.js';

const IMPORT_ROWS = 6_000;
const DEMO_PASSWORD = 'statorline-demo';

let workDir: string;
let databaseName: string;
let databaseUrl: string;
let port: number;
let db: pg.Client;
let server: ServerProcess | undefined;
let agent: ReturnType<typeof request.agent>;
let csrf: string;

interface ServerProcess {
  child: ChildProcess;
  /** Everything the process wrote to stdout and stderr so far. */
  log(): string;
  exit: Promise<{ code: number | null; signal: NodeJS.Signals | null }>;
}

async function freePort(): Promise<number> {
  const probe = createServer();
  await new Promise<void>((resolve) => probe.listen(0, '127.0.0.1', resolve));
  const { port: free } = probe.address() as { port: number };
  await new Promise((resolve) => probe.close(resolve));
  return free;
}

async function startServer(): Promise<ServerProcess> {
  const started = Date.now();
  const child = spawn(process.execPath, ['--import', 'tsx', 'server/cli/start.ts'], {
    cwd: projectRoot,
    env: {
      ...process.env,
      NODE_ENV: 'production',
      DATABASE_URL: databaseUrl,
      PORT: String(port),
      HOST: '127.0.0.1',
      SESSION_SECRET: 'crash-test-secret-crash-test-secret',
      SMTP_CATCHER_PORT: '0',
      UPLOAD_DIR: join(workDir, 'uploads'),
      STATORLINE_DIST: relative(projectRoot, join(workDir, 'client')),
      LOG_LEVEL: 'info',
    },
    stdio: ['ignore', 'pipe', 'pipe'],
  });
  let output = '';
  child.stdout?.on('data', (chunk: Buffer) => (output += chunk.toString()));
  child.stderr?.on('data', (chunk: Buffer) => (output += chunk.toString()));
  const exit = new Promise<{ code: number | null; signal: NodeJS.Signals | null }>((resolve) =>
    child.once('exit', (code, signal) => {
      // Only the test kills with SIGKILL; any other end before SIGTERM is a crash worth reading.
      if (signal !== 'SIGKILL' && !output.includes('SIGTERM: stopping')) console.error(`the server ended (${code ?? signal}):\n${output.slice(-4000)}`);
      resolve({ code, signal });
    }),
  );
  const ready = await Promise.race([
    until('the server to be ready', async () => (output.includes('Statorline is ready on') ? true : undefined), 150_000),
    exit.then(({ code }) => {
      throw new Error(`the server exited (${code}) before it was ready:\n${output}`);
    }),
  ]);
  expect(ready).toBe(true);
  console.info(`server ready in ${Date.now() - started} ms`);
  return { child, log: () => output, exit };
}

async function kill(target: ServerProcess): Promise<void> {
  target.child.kill('SIGKILL');
  expect(await target.exit).toEqual({ code: null, signal: 'SIGKILL' });
}

async function until<T>(what: string, probe: () => Promise<T | undefined>, timeoutMs = 60_000): Promise<T> {
  const deadline = Date.now() + timeoutMs;
  while (Date.now() < deadline) {
    const value = await probe();
    if (value !== undefined) return value;
    await new Promise((resolve) => setTimeout(resolve, 25));
  }
  throw new Error(`timed out waiting for ${what}`);
}

async function signInAsEngineer(): Promise<void> {
  agent = request.agent(`http://127.0.0.1:${port}`);
  const token = await agent.get('/api/auth/csrf').expect(200);
  const login = await agent.post('/api/auth/login').set('x-csrf-token', token.body.token as string).send({ email: 'engineer@kestrel.example', password: DEMO_PASSWORD }).expect(200);
  csrf = login.body.csrfToken as string;
}

const post = (path: string) => agent.post(path).set('x-csrf-token', csrf);

async function scalar(sql: string, values: unknown[] = []): Promise<number> {
  const result = await db.query<{ value: string | number }>(sql, values);
  return Number(result.rows[0]?.value);
}

/** A second connection with an open transaction, to hold rows and tables that the server's work waits on. */
async function openHolder(): Promise<pg.Client> {
  const holder = new pg.Client({ connectionString: databaseUrl });
  holder.on('error', () => undefined);
  await holder.connect();
  await holder.query('BEGIN');
  return holder;
}

/**
 * Holds a screening job's row as soon as the job is claimed: its first progress write then waits, so
 * the job stays `running` (its motors loaded, its first ones assessed) for as long as the test needs.
 */
async function holdJobOnceRunning(holder: pg.Client, jobId: number): Promise<void> {
  await until('the screening to be claimed', async () => {
    const row = await db.query<{ status: string }>('SELECT status FROM jobs WHERE id = $1', [jobId]);
    return row.rows[0]?.status === 'running' ? true : undefined;
  }, 60_000);
  await holder.query('SELECT id FROM jobs WHERE id = $1 FOR UPDATE', [jobId]);
  const held = await db.query<{ status: string }>('SELECT status FROM jobs WHERE id = $1', [jobId]);
  expect(held.rows[0]?.status).toBe('running');
}

/** The backend of the app that waits on the audit table, once it does. */
function waiterOnAuditTable(): Promise<number> {
  return until('a transaction waiting on the audit table', async () => {
    const result = await db.query<{ pid: number }>(
      `SELECT l.pid FROM pg_locks l JOIN pg_class c ON c.oid = l.relation JOIN pg_stat_activity a ON a.pid = l.pid
       WHERE NOT l.granted AND c.relname = 'audit_logs' AND a.application_name = 'statorline'`,
    );
    return result.rows[0]?.pid;
  });
}

async function connectionRefused(): Promise<boolean> {
  return new Promise((resolve) => {
    const socket = connect(port, '127.0.0.1');
    socket.once('connect', () => {
      socket.destroy();
      resolve(false);
    });
    socket.once('error', (error: NodeJS.ErrnoException) => resolve(error.code === 'ECONNREFUSED'));
  });
}

function motorsCsv(rows: number): Buffer {
  const lines = ['Tag,Rated power (kW),Poles,Application,Control method'];
  const controls = ['DOL', 'throttling valve', 'VSD', 'outlet damper'];
  for (let index = 1; index <= rows; index += 1) {
    lines.push(`CRASH-${String(index).padStart(5, '0')},${[4, 7.5, 15, 30, 55][index % 5]},${[2, 4, 6][index % 3]},pump,${controls[index % 4]}`);
  }
  return Buffer.from(`${lines.join('\n')}\n`);
}

beforeAll(async () => {
  workDir = mkdtempSync(join(tmpdir(), 'statorline-crash-'));
  // A stand-in client build dated in the future, so the start command never builds the client here.
  mkdirSync(join(workDir, 'client'));
  writeFileSync(join(workDir, 'client', 'index.html'), '<!doctype html><html><head></head><body>test</body></html>');
  const future = new Date('2100-01-01T00:00:00Z');
  utimesSync(join(workDir, 'client', 'index.html'), future, future);

  databaseName = `statorline_crash_${randomBytes(4).toString('hex')}`;
  const admin = new pg.Client({ connectionString: inject('clusterUrl') });
  await admin.connect();
  await admin.query(`CREATE DATABASE ${databaseName}`);
  await admin.end();
  const url = new URL(inject('clusterUrl'));
  url.pathname = `/${databaseName}`;
  databaseUrl = url.toString();
  db = new pg.Client({ connectionString: databaseUrl });
  await db.connect();
  port = await freePort();
  server = await startServer();
  await signInAsEngineer();
}, 180_000);

afterAll(async () => {
  if (server && server.child.exitCode === null && server.child.signalCode === null) {
    server.child.kill('SIGTERM');
    await Promise.race([server.exit, new Promise((resolve) => setTimeout(resolve, 15_000))]);
    if (server.child.exitCode === null && server.child.signalCode === null) server.child.kill('SIGKILL');
  }
  await db?.end();
  const admin = new pg.Client({ connectionString: inject('clusterUrl') });
  await admin.connect();
  await admin.query(`DROP DATABASE IF EXISTS ${databaseName} WITH (FORCE)`);
  await admin.end();
  if (workDir) rmSync(workDir, { recursive: true, force: true });
}, 60_000);

afterEach((context) => {
  if (context.task.result?.state === 'fail' && server) console.error(`server log (end):\n${server.log().slice(-4000)}`);
});

describe('the server killed or stopped in the middle of its work', () => {
  let siteId: number;
  let batchId: number;

  it('killed during an import commit: nothing of it is written, and after a restart it commits in full', async () => {
    const site = await post('/api/sites')
      .send({ name: 'Crash test plant', voltageV: 400, frequencyHz: 50, energyPricePerKwh: 0.15, demandChargePerKwMonth: 5, currency: 'EUR', co2KgPerKwh: 0.25, defaultHoursPerYear: 6000 })
      .expect(201);
    siteId = site.body.id as number;
    const preview = await post('/api/imports').field('siteId', String(siteId)).attach('file', motorsCsv(IMPORT_ROWS), 'crash.csv').expect(201);
    expect(preview.body.rows).toMatchObject({ total: IMPORT_ROWS, valid: IMPORT_ROWS });
    batchId = preview.body.id as number;
    const auditsBefore = await scalar('SELECT count(*) AS value FROM audit_logs');

    // The commit's last step writes the motors' history: holding the audit table keeps the commit
    // in the middle (motors written in its transaction, progress shown) for as long as the test needs.
    const holder = await openHolder();
    await holder.query('LOCK TABLE audit_logs IN SHARE MODE');
    const commit = post(`/api/imports/${batchId}/commit`).then(
      (response) => response.status,
      () => 'cut',
    );
    const progress = await until('a committed step', async () => {
      const row = await db.query<{ status: string; progress: number }>('SELECT status, progress FROM import_batches WHERE id = $1', [batchId]);
      return (row.rows[0]?.progress ?? 0) > 0 ? row.rows[0] : undefined;
    });
    const pid = await waiterOnAuditTable();
    await kill(server!);
    expect(progress.status).toBe('committing');
    expect(progress.progress).toBeLessThan(1);
    expect(await commit).toBe('cut');
    await holder.query('ROLLBACK');
    await holder.end();
    // The orphaned backend finds its client gone and rolls back.
    await until('the killed server’s transaction to end', async () => ((await scalar('SELECT count(*) AS value FROM pg_stat_activity WHERE pid = $1', [pid])) === 0 ? true : undefined), 30_000);

    // None of it: no motor, no audit row, no row outcome; the batch still reads `committing`.
    expect(await scalar('SELECT count(*) AS value FROM motors WHERE site_id = $1', [siteId])).toBe(0);
    expect(await scalar('SELECT count(*) AS value FROM audit_logs')).toBe(auditsBefore);
    expect(await scalar('SELECT count(*) AS value FROM import_rows WHERE batch_id = $1 AND motor_id IS NOT NULL', [batchId])).toBe(0);

    server = await startServer();
    expect(server.log()).toContain(`import commit(s) ${batchId} were interrupted`);
    const batch = await agent.get(`/api/imports/${batchId}`).expect(200);
    expect(batch.body).toMatchObject({ status: 'failed', progress: 0, failure: 'The commit was interrupted (the server or its database stopped); nothing was written. Commit again.' });
    const again = await post(`/api/imports/${batchId}/commit`).expect(200);
    expect(again.body).toEqual({ created: IMPORT_ROWS, updated: 0, skipped: 0 });
    expect(await scalar('SELECT count(*) AS value FROM motors WHERE site_id = $1 AND import_batch_id = $2', [siteId, batchId])).toBe(IMPORT_ROWS);
  }, 120_000);

  it('killed during a business-case generation and a screening job: no case is half-written, the job is re-queued and runs again', async () => {
    // A screening of the 6,000 motors, running when the server dies; a business case whose row is
    // inserted and whose transaction waits on the audit table.
    const holder = await openHolder();
    const started = await post(`/api/sites/${siteId}/screening`).send({}).expect(202);
    const jobId = started.body.jobId as number;
    await holdJobOnceRunning(holder, jobId);
    await holder.query('LOCK TABLE audit_logs IN SHARE MODE');

    const casesBefore = await scalar('SELECT count(*) AS value FROM business_cases');
    const caseAuditsBefore = await scalar(`SELECT count(*) AS value FROM audit_logs WHERE entity = 'business-case'`);
    const generation = post('/api/cases').send({ siteId }).then(
      (response) => response.status,
      () => 'cut',
    );
    const pid = await waiterOnAuditTable();
    // The case row is inserted in the waiting transaction: it holds the table's row-exclusive lock.
    expect(await scalar(`SELECT count(*) AS value FROM pg_locks l JOIN pg_class c ON c.oid = l.relation WHERE l.pid = $1 AND l.granted AND c.relname = 'business_cases' AND l.mode = 'RowExclusiveLock'`, [pid])).toBe(1);
    await kill(server!);
    expect(await generation).toBe('cut');
    await holder.query('ROLLBACK');
    await holder.end();
    // The orphaned backend finds its client gone and rolls back.
    await until('the killed server’s transaction to end', async () => ((await scalar('SELECT count(*) AS value FROM pg_stat_activity WHERE pid = $1', [pid])) === 0 ? true : undefined), 30_000);
    expect(await scalar('SELECT count(*) AS value FROM business_cases')).toBe(casesBefore);
    expect(await scalar(`SELECT count(*) AS value FROM audit_logs WHERE entity = 'business-case'`)).toBe(caseAuditsBefore);

    // The job was left `running` by a dead process; a minute without heartbeat makes it stale.
    const left = await db.query<{ status: string; attempts: number; locked_by: string | null }>('SELECT status, attempts, locked_by FROM jobs WHERE id = $1', [jobId]);
    expect(left.rows[0]).toMatchObject({ status: 'running', attempts: 1 });
    expect(left.rows[0]?.locked_by).not.toBeNull();
    await db.query(`UPDATE jobs SET heartbeat_at = now() - interval '2 minutes' WHERE id = $1`, [jobId]);

    server = await startServer();
    expect(server.log()).toContain('re-queued 1 job(s) left running by a stopped process');
    // Run again from the beginning by the new process, to the end.
    await until('the screening to run again and finish', async () => {
      const row = await db.query<{ status: string; attempts: number }>('SELECT status, attempts FROM jobs WHERE id = $1', [jobId]);
      return row.rows[0]?.attempts === 2 && row.rows[0].status === 'done' ? true : undefined;
    }, 90_000);
    const result = await agent.get(`/api/jobs/${jobId}`).expect(200);
    expect(result.body).toMatchObject({ status: 'done', progress: 1 });
    // Generating again works, and the version count has no gap.
    const generated = await post('/api/cases').send({ siteId }).expect(201);
    expect(generated.body).toMatchObject({ version: 1, status: 'draft' });
    expect(generated.body.results.items).toHaveLength(IMPORT_ROWS);
  }, 120_000);

  it('stopped by SIGTERM: the request in flight completes, new connections are refused, the job is left queued, exit 0', async () => {
    // A new screening, held at its first progress write so that it still runs when the server stops;
    // a business case held on the audit table, in flight when SIGTERM arrives.
    const holder = await openHolder();
    const started = await post(`/api/sites/${siteId}/screening`).send({}).expect(202);
    const stopJobId = started.body.jobId as number;
    await holdJobOnceRunning(holder, stopJobId);
    await holder.query('LOCK TABLE audit_logs IN SHARE MODE');
    const generation = post('/api/cases').send({ siteId }).then((response) => response);
    await waiterOnAuditTable();
    server!.child.kill('SIGTERM');
    await until('new connections to be refused', async () => ((await connectionRefused()) ? true : undefined), 15_000);
    await holder.query('ROLLBACK');
    await holder.end();

    const response = await generation;
    expect(response.status).toBe(201);
    expect(response.body).toMatchObject({ version: 2 });
    expect(await server!.exit).toEqual({ code: 0, signal: null });
    expect(server!.log()).toContain('SIGTERM: stopping');
    expect(server!.log()).toContain('stopped cleanly');
    // Resumable: back in the queue, owned by nobody; the next runner to claim it starts it again.
    const job = await db.query<{ status: string; attempts: number; locked_by: string | null }>('SELECT status, attempts, locked_by FROM jobs WHERE id = $1', [stopJobId]);
    expect(job.rows[0]).toEqual({ status: 'queued', attempts: 1, locked_by: null });
    expect(await scalar('SELECT count(*) AS value FROM business_cases WHERE site_id = $1', [siteId])).toBe(2);
    server = undefined;
  }, 90_000);
});
