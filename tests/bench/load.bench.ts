/**
 * `npm run bench -- load` (issue 10): the HTTP server under 200 concurrent connections for 30 s per
 * scenario, driven by autocannon on loopback, with 100,000 motors seeded in one organisation.
 *
 * Two processes, so the load generator does not steal the server's event loop: this file forks
 * itself with the argument `serve`; the child starts a throwaway PostgreSQL cluster, migrates,
 * seeds, and serves the real Express app (createApp, the same pools as `npm start`) on 127.0.0.1;
 * the parent signs several users in (session cookie + CSRF token each), spreads its connections
 * over those sessions and runs the scenarios one after another. Per scenario it prints requests,
 * req/s, non-2xx (by status), errors, timeouts, latency p50/p95/p99 (from every response, not
 * autocannon's p97.5 histogram), and the server process's CPU time (process.cpuUsage, asked over IPC).
 *
 * Scenarios:
 * - register: GET /api/motors, first page (50 rows) with a filter (rotating over four filters);
 * - motor: GET /api/motors/:id of a random motor;
 * - study: POST /api/studies, a quick study of a random register motor saved as an engineer would;
 * - case: GET /api/cases/:id, the report of one site's business case generated before the run.
 *   Generating a case per request (POST /api/cases) is not what 200 people do at once: a case is
 *   generated once by an engineer and then read many times by approvers and colleagues (the report
 *   page, the link in the e-mail). So the load scenario reads the generated report; generation time
 *   for a 10,000-motor site is measured by cases.bench.ts.
 *
 * LOAD_CONNECTIONS (default 200), LOAD_SECONDS (default 30), LOAD_MOTORS (default 100,000),
 * LOAD_SCENARIOS (comma list, default all) shorten a run. No assertions: figures only.
 */
import { fork, type ChildProcess } from 'node:child_process';
import { mkdtempSync, rmSync } from 'node:fs';
import { createRequire } from 'node:module';
import { cpus, loadavg, tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';

const CONNECTIONS = Number(process.env.LOAD_CONNECTIONS ?? 200);
const SECONDS = Number(process.env.LOAD_SECONDS ?? 30);
const MOTORS = Number(process.env.LOAD_MOTORS ?? 100_000);
const SITES = 20;
const USERS = 8;
const PASSWORD = 'load-bench-password';
const SCENARIOS = (process.env.LOAD_SCENARIOS ?? 'register,motor,study,case').split(',');

interface Ready {
  kind: 'ready';
  port: number;
  emails: string[];
  motorIds: { min: number; max: number };
  siteIds: number[];
  caseId: number;
  caseMotors: number;
  caseBytes: number;
  seedMs: number;
}
interface CpuReply {
  kind: 'cpu';
  cpuMs: number;
  queries: number;
  pool: { size: number; available: number; using: number; waiting: number };
}
type FromServer = Ready | CpuReply;

// ---------------------------------------------------------------- server side (child process)

async function serve(): Promise<void> {
  const { connectDatabase, database } = await import('../../server/lib/database.js');
  const { setLogLevel } = await import('../../server/lib/logger.js');
  const { migrator } = await import('../../server/lib/migrator.js');
  const { startCluster } = await import('../../server/lib/postgres-cluster.js');
  const { setUploadDir } = await import('../../server/lib/uploads.js');
  const { Tenant } = await import('../../server/lib/tenant.js');
  const { hashPassword } = await import('../../server/lib/passwords.js');
  const { loadConfig } = await import('../../server/lib/config.js');
  const { createApp } = await import('../../server/app.js');
  const { createMailer } = await import('../../server/lib/mail.js');
  const { createCase } = await import('../../server/cases/service.js');
  const { Organization, User } = await import('../../server/models/index.js');
  const { createSite } = await import('../support/api.js');

  setLogLevel(process.env.LOAD_LOG === '1' ? 'warn' : 'silent');
  // Count every query sent to PostgreSQL (Sequelize's pool and the session store's pool both use pg.Client).
  const pg = (await import('pg')).default;
  const clientQuery = pg.Client.prototype.query as (...args: unknown[]) => unknown;
  let queries = 0;
  const sqlCounts = new Map<string, number>();
  pg.Client.prototype.query = function countedQuery(this: unknown, ...args: unknown[]) {
    queries += 1;
    if (process.env.LOAD_SQL === '1') {
      const first = args[0] as string | { text?: string };
      const text = (typeof first === 'string' ? first : (first.text ?? '')).slice(0, 90);
      sqlCounts.set(text, (sqlCounts.get(text) ?? 0) + 1);
    }
    return clientQuery.apply(this, args);
  } as typeof pg.Client.prototype.query;
  const dataDir = mkdtempSync(join(tmpdir(), 'statorline-load-'));
  const cluster = await startCluster({ dataDir, port: 51000 + Math.floor(Math.random() * 4000), throwaway: true });
  const url = cluster.url('statorline_load');
  await cluster.ensureDatabase('statorline_load');
  // The same pool settings as `npm start` (connectDatabase's defaults).
  const sequelize = connectDatabase(url);
  await migrator(sequelize).up();
  setUploadDir(join(dataDir, 'uploads'));

  const seedStart = performance.now();
  const organization = await Organization.create({ name: 'Load Works', slug: 'load-works' });
  const sites = [];
  for (let index = 0; index < SITES; index += 1) {
    sites.push(await createSite(organization, { name: `Plant ${index + 1}` }));
  }
  // One INSERT … SELECT from generate_series (as register.bench.ts): 100,000 rows in seconds.
  await sequelize.query(
    `INSERT INTO motors (organization_id, site_id, tag, description, area, application, rated_power_kw, speed_rpm, poles, voltage_v,
       frequency_hz, efficiency_class, control_method, hours_per_year, load_factor, status, manufacturer, version, created_at, updated_at)
     SELECT $1, ($2::int[])[1 + i % $4], 'M-' || lpad(i::text, 6, '0'), 'Motor ' || i || ' of line ' || (i % 40), 'Area ' || (i % 25),
       (ARRAY['fan','pump','compressor','conveyor','mixer','other'])[1 + i % 6]::"enum_motors_application",
       (ARRAY[0.37,0.75,1.5,3,5.5,7.5,11,15,22,37,55,75,110,160])[1 + i % 14], 1460, 4, 400, 50,
       (ARRAY['IE1','IE2','IE3','IE4','unknown'])[1 + i % 5]::"enum_motors_efficiency_class",
       (ARRAY['direct-on-line','throttle-valve','outlet-damper','inlet-vanes','variable-speed-drive'])[1 + i % 5]::"enum_motors_control_method",
       2000 + (i % 7) * 900, 0.5 + (i % 5) * 0.1, CASE WHEN i % 50 = 0 THEN 'retired' ELSE 'in-service' END::"enum_motors_status",
       (ARRAY['Example Motorworks','Sample Electric','Demo Drives'])[1 + i % 3], 0, now(), now()
     FROM generate_series(1, $3) AS i`,
    { bind: [organization.id, sites.map((site) => site.id), MOTORS, SITES] },
  );
  // What autovacuum does shortly after a bulk load (statistics, visibility map for index-only counts).
  await sequelize.query('VACUUM ANALYZE motors');
  const [range] = (await sequelize.query('SELECT min(id)::int AS min, max(id)::int AS max FROM motors', { plain: false, raw: true }))[0] as Array<{ min: number; max: number }>;

  const passwordHash = await hashPassword(PASSWORD);
  const users = [];
  for (let index = 0; index < USERS; index += 1) {
    users.push(
      await User.create({ organizationId: organization.id, email: `engineer${index}@load.example`, name: `Load engineer ${index}`, role: 'engineer', status: 'active', passwordHash }),
    );
  }
  const first = users[0]!;
  const tenant = new Tenant({ id: first.id, email: first.email, name: first.name, role: 'engineer', organization: { id: organization.id, name: organization.name } });
  const generated = await createCase(tenant, { siteId: sites[0]!.id });
  const seedMs = performance.now() - seedStart;

  const config = { ...loadConfig({ NODE_ENV: 'production', SESSION_SECRET: 'load-bench-secret-load-bench', LOG_LEVEL: 'silent' }), publicUrl: 'http://127.0.0.1' };
  const mailer = createMailer({ catcherPort: 9, from: config.mailFrom });
  const { app, close } = createApp({ config, databaseUrl: url, mailer, signInAttemptsPerWindow: 1000 });
  const server = app.listen(0, '127.0.0.1');
  await new Promise<void>((resolve) => server.once('listening', () => resolve()));
  const address = server.address();
  const port = typeof address === 'object' && address ? address.port : 0;

  const send = (message: FromServer) => process.send?.(message);
  process.on('message', (message: { kind: string }) => {
    if (message.kind === 'cpu') {
      const usage = process.cpuUsage();
      const pool = (sequelize.connectionManager as unknown as { pool: { size: number; available: number; using: number; waiting: number } }).pool;
      if (process.env.LOAD_SQL === '1') {
        for (const [text, count] of [...sqlCounts].sort((a, b) => b[1] - a[1]).slice(0, 12)) process.stderr.write(`${String(count).padStart(6)} ${text}\n`);
        sqlCounts.clear();
      }
      send({ kind: 'cpu', cpuMs: (usage.user + usage.system) / 1000, queries, pool: { size: pool.size, available: pool.available, using: pool.using, waiting: pool.waiting } });
    } else if (message.kind === 'stop') {
      server.closeIdleConnections();
      server.close(() => {
        void (async () => {
          mailer.close();
          await close();
          await database().close();
          await cluster.stop();
          rmSync(dataDir, { recursive: true, force: true });
          process.exit(0);
        })();
      });
    }
  });
  send({
    kind: 'ready',
    port,
    emails: users.map((user) => user.email),
    motorIds: range!,
    siteIds: sites.map((site) => site.id),
    caseId: generated.id,
    caseMotors: generated.basis.motorCount,
    caseBytes: JSON.stringify(generated).length,
    seedMs,
  });
}

// ---------------------------------------------------------------- load side (parent process)

interface AutocannonClient {
  setRequests(requests: AutocannonRequest[]): void;
}
interface AutocannonRequest {
  method?: string;
  path?: string;
  headers?: Record<string, string>;
  body?: string;
  setupRequest?: (request: AutocannonRequest) => AutocannonRequest;
}
interface AutocannonResult {
  requests: { total: number; average: number };
  duration: number;
  errors: number;
  timeouts: number;
  non2xx: number;
  statusCodeStats: Record<string, { count: number }>;
}
interface AutocannonInstance {
  on(event: 'response', listener: (client: unknown, statusCode: number, resBytes: number, responseTime: number) => void): void;
  on(event: 'reqError', listener: (error: Error) => void): void;
}
type Autocannon = ((options: Record<string, unknown>, done: (error: Error | null, result: AutocannonResult) => void) => AutocannonInstance) & {
  track?: unknown;
};
const autocannon = createRequire(import.meta.url)('autocannon') as Autocannon;

interface Session {
  cookie: string;
  csrf: string;
}

function cookieOf(response: Response): string {
  const cookies = response.headers.getSetCookie();
  const sid = cookies.find((cookie) => cookie.startsWith('statorline.sid='));
  if (!sid) throw new Error(`no session cookie (status ${response.status})`);
  return sid.split(';')[0]!;
}

async function signIn(base: string, email: string): Promise<Session> {
  const csrfResponse = await fetch(`${base}/api/auth/csrf`);
  const anonymous = cookieOf(csrfResponse);
  const { token } = (await csrfResponse.json()) as { token: string };
  const login = await fetch(`${base}/api/auth/login`, {
    method: 'POST',
    headers: { 'content-type': 'application/json', 'x-csrf-token': token, cookie: anonymous },
    body: JSON.stringify({ email, password: PASSWORD }),
  });
  if (login.status !== 200) throw new Error(`sign-in of ${email} answered ${login.status}: ${await login.text()}`);
  const body = (await login.json()) as { csrfToken: string };
  return { cookie: cookieOf(login), csrf: body.csrfToken };
}

const percentile = (sorted: number[], p: number) => sorted[Math.min(sorted.length - 1, Math.max(0, Math.ceil((p / 100) * sorted.length) - 1))] ?? Number.NaN;
const randomInt = (min: number, max: number) => min + Math.floor(Math.random() * (max - min + 1));

async function main(): Promise<void> {
  process.stdout.write(`${CONNECTIONS} connections × ${SECONDS} s per scenario, ${MOTORS} motors; ${cpus().length} cores, load average ${loadavg()[0]!.toFixed(1)}\n`);
  const child: ChildProcess = fork(fileURLToPath(import.meta.url), ['serve'], { execArgv: ['--import', 'tsx', ...(process.env.LOAD_CPU_PROF ? ['--cpu-prof', `--cpu-prof-dir=${process.env.LOAD_CPU_PROF}`] : [])], stdio: ['ignore', 'inherit', 'inherit', 'ipc'] });
  const replies: Array<(message: FromServer) => void> = [];
  child.on('message', (message: FromServer) => replies.shift()?.(message));
  const next = <T extends FromServer>() => new Promise<T>((resolve) => replies.push(resolve as (message: FromServer) => void));
  const childExit = new Promise<number | null>((resolve) => child.once('exit', (code) => resolve(code)));
  const ready = await Promise.race([next<Ready>(), childExit.then((code) => Promise.reject(new Error(`server process exited with ${code} before it was ready`)))]);
  const askCpu = () => {
    const reply = next<CpuReply>();
    child.send({ kind: 'cpu' });
    return reply;
  };
  // Requests still queued in the server from the previous scenario (timed out at the client but
  // still being served) would be billed to the next one: wait until the server's pool is idle.
  const drain = async () => {
    const start = performance.now();
    for (let idle = 0; idle < 3 && performance.now() - start < 120_000; ) {
      const state = await askCpu();
      idle = state.pool.using === 0 && state.pool.waiting === 0 ? idle + 1 : 0;
      await new Promise((resolve) => setTimeout(resolve, 200));
    }
  };
  try {
    const base = `http://127.0.0.1:${ready.port}`;
    process.stdout.write(
      `seeded ${MOTORS} motors on ${SITES} sites, ${USERS} engineers and a business case of ${ready.caseMotors} motors (${(ready.caseBytes / 1e6).toFixed(2)} MB JSON) in ${(ready.seedMs / 1000).toFixed(1)} s\n`,
    );
    const sessions: Session[] = [];
    for (const email of ready.emails) sessions.push(await signIn(base, email));

    const { min, max } = ready.motorIds;
    const siteIds = ready.siteIds;
    const filters = [
      () => `application=fan`,
      () => `siteId=${siteIds[randomInt(0, siteIds.length - 1)]}&application=pump,fan&minKw=5`,
      () => `efficiencyClass=IE1&sort=-ratedPowerKw`,
      () => `q=line%20${randomInt(0, 39)}`,
    ];
    const studyBody = (motorId: number) =>
      JSON.stringify({
        name: `Load study of motor ${motorId}`,
        motorId,
        motor: { tag: `M-${motorId}`, application: 'fan', ratedPowerKw: 15, poles: 4, efficiencyClass: 'IE1', controlMethod: 'outlet-damper', hoursPerYear: 6000, loadFactor: 0.8 },
        site: { name: 'Plant 1', voltageV: 400, frequencyHz: 50, energyPricePerKwh: 0.15, demandChargePerKwMonth: 5, currency: 'EUR', co2KgPerKwh: 0.25 },
      });
    const scenarios: Record<string, { label: string; request: () => AutocannonRequest }> = {
      register: {
        label: 'register list, first page with a filter (GET /api/motors?…&pageSize=50)',
        request: () => ({ method: 'GET', path: `/api/motors?${filters[randomInt(0, filters.length - 1)]!()}&page=1&pageSize=50` }),
      },
      motor: { label: 'motor detail (GET /api/motors/:id)', request: () => ({ method: 'GET', path: `/api/motors/${randomInt(min, max)}` }) },
      study: {
        label: 'quick study save (POST /api/studies with a register motor)',
        request: () => {
          const motorId = randomInt(min, max);
          return { method: 'POST', path: '/api/studies', body: studyBody(motorId) };
        },
      },
      case: { label: `site business case report (GET /api/cases/:id, ${ready.caseMotors} motors)`, request: () => ({ method: 'GET', path: `/api/cases/${ready.caseId}` }) },
    };

    for (const name of SCENARIOS) {
      const scenario = scenarios[name];
      if (!scenario) throw new Error(`unknown scenario ${name} (register, motor, study, case)`);
      await drain();
      const latencies: number[] = [];
      const errorKinds = new Map<string, number>();
      let connection = 0;
      const cpuBefore = await askCpu();
      const wallStart = performance.now();
      const result = await new Promise<AutocannonResult>((resolve, reject) => {
        const instance = autocannon(
          {
            url: base,
            connections: CONNECTIONS,
            duration: SECONDS,
            timeout: 10,
            setupClient: (client: AutocannonClient) => {
              const session = sessions[connection % sessions.length]!;
              connection += 1;
              // As a browser sends them (every browser accepts gzip; the case report is then sent compressed).
              const headers = {
                cookie: session.cookie,
                'x-csrf-token': session.csrf,
                'content-type': 'application/json',
                accept: 'application/json',
                'accept-encoding': 'gzip, deflate, br',
              };
              client.setRequests([{ headers, setupRequest: (request) => ({ ...request, ...scenario.request(), headers }) }]);
            },
          },
          (error, value) => (error ? reject(error) : resolve(value)),
        );
        instance.on('response', (_client, _status, _bytes, responseTime) => latencies.push(responseTime));
        instance.on('reqError', (error) => errorKinds.set(error.message, (errorKinds.get(error.message) ?? 0) + 1));
      });
      const wallMs = performance.now() - wallStart;
      const cpuAfter = await askCpu();
      latencies.sort((a, b) => a - b);
      const statuses = Object.entries(result.statusCodeStats)
        .map(([code, stat]) => `${code}×${stat.count}`)
        .join(' ');
      const errors = [...errorKinds].map(([message, count]) => `${message}×${count}`).join('; ');
      process.stdout.write(
        [
          `\n${name}: ${scenario.label}`,
          `  requests ${result.requests.total} in ${(wallMs / 1000).toFixed(1)} s = ${(result.requests.total / result.duration).toFixed(0)} req/s; statuses ${statuses || 'none'}`,
          `  non-2xx ${result.non2xx}, errors ${result.errors}${errors ? ` (${errors})` : ''}, timeouts ${result.timeouts}`,
          `  latency p50 ${percentile(latencies, 50).toFixed(0)} ms, p95 ${percentile(latencies, 95).toFixed(0)} ms, p99 ${percentile(latencies, 99).toFixed(0)} ms, max ${(latencies[latencies.length - 1] ?? Number.NaN).toFixed(0)} ms`,
          `  server CPU ${((cpuAfter.cpuMs - cpuBefore.cpuMs) / 1000).toFixed(1)} s in ${(wallMs / 1000).toFixed(1)} s wall (${((cpuAfter.cpuMs - cpuBefore.cpuMs) / wallMs * 100).toFixed(0)} % of one core); ${((cpuAfter.queries - cpuBefore.queries) / Math.max(1, result.requests.total)).toFixed(1)} SQL queries per request; Sequelize pool after: ${cpuAfter.pool.using} in use, ${cpuAfter.pool.waiting} waiting; load average ${loadavg()[0]!.toFixed(1)}`,
        ].join('\n') + '\n',
      );
    }
  } finally {
    await drain();
    child.send({ kind: 'stop' });
    await childExit;
  }
}

if (process.argv[2] === 'serve') {
  serve().catch((error: unknown) => {
    process.stderr.write(`${error instanceof Error ? (error.stack ?? error.message) : String(error)}\n`);
    process.exit(1);
  });
} else {
  main().catch((error: unknown) => {
    process.stderr.write(`${error instanceof Error ? (error.stack ?? error.message) : String(error)}\n`);
    process.exit(1);
  });
}
