/**
 * `npm run bench -- client` (issue 10): the client's initial JavaScript and the time until the Motor
 * register is usable in chromium.
 *
 * 1. Builds the client into its own folder (dist/bench-client; CLIENT_SKIP_BUILD=1 reuses it) and
 *    measures the JavaScript index.html loads before anything else: its entry script, its
 *    modulepreload links and, transitively, every chunk those import statically (dynamic
 *    `import()` chunks — lazy routes, charts — are not initial). Raw and gzip sizes (node:zlib,
 *    default level, as a server or proxy would send them); the largest chunks overall.
 * 2. Starts a private stack (server/cli/start.ts: own cluster, ports and data folder, the demo seed,
 *    this build), signs in once as the demo engineer, then does CLIENT_RUNS (default 5) cold loads of
 *    /motors (each in a fresh browser profile with only the session cookie: empty HTTP cache) and
 *    records the time from navigation start until the register is interactive: table rows rendered
 *    and the search input enabled. Prints the median and each run, with domContentLoaded and load.
 */
import { spawn, spawnSync } from 'node:child_process';
import { existsSync, readFileSync, readdirSync, rmSync, statSync } from 'node:fs';
import { loadavg, tmpdir } from 'node:os';
import { join } from 'node:path';
import { gzipSync } from 'node:zlib';
import { projectRoot } from '../../server/lib/config.js';
import { launchBrowser, DEMO_PASSWORD } from '../support/browser.js';
import { initialScripts } from '../support/bundle.js';

const DIST = 'dist/bench-client';
const distDir = join(projectRoot, DIST);
const RUNS = Number(process.env.CLIENT_RUNS ?? 5);
/** The guard of tests/e2e/bundle-size.test.ts. */
const BUDGET_KB_GZ = 400;

interface Chunk {
  file: string;
  raw: number;
  gzip: number;
}

const kb = (bytes: number) => `${(bytes / 1024).toFixed(1)} kB`;

function sizeOf(file: string): Chunk {
  const content = readFileSync(join(distDir, file));
  return { file, raw: content.length, gzip: gzipSync(content).length };
}

function build(): void {
  if (process.env.CLIENT_SKIP_BUILD === '1' && existsSync(join(distDir, 'index.html'))) {
    process.stdout.write(`reusing ${DIST}\n`);
    return;
  }
  const start = performance.now();
  const result = spawnSync('npx', ['quasar', 'build'], { cwd: projectRoot, env: { ...process.env, STATORLINE_DIST: DIST }, stdio: ['ignore', 'pipe', 'pipe'], maxBuffer: 64 * 1024 * 1024 });
  // The build's warnings are noise here; its output is shown only when it fails.
  if (result.status !== 0) throw new Error(`quasar build exited with ${result.status}:\n${String(result.stdout)}\n${String(result.stderr)}`);
  process.stdout.write(`built ${DIST} in ${((performance.now() - start) / 1000).toFixed(0)} s\n`);
}

function allFiles(folder: string, prefix = ''): string[] {
  return readdirSync(join(folder, prefix)).flatMap((name) => {
    const path = prefix ? `${prefix}/${name}` : name;
    return statSync(join(folder, path)).isDirectory() ? allFiles(folder, path) : [path];
  });
}

function reportSizes(): void {
  const initial = initialScripts(distDir).map(sizeOf).sort((a, b) => b.gzip - a.gzip);
  const total = initial.reduce((sum, chunk) => ({ raw: sum.raw + chunk.raw, gzip: sum.gzip + chunk.gzip }), { raw: 0, gzip: 0 });
  const initialCss = [...readFileSync(join(distDir, 'index.html'), 'utf8').matchAll(/<link[^>]+rel="stylesheet"[^>]+href="\/?([^"]+)"/g)].map((match) => sizeOf(match[1]!));
  process.stdout.write(
    `initial JavaScript: ${initial.length} files, ${kb(total.raw)} raw, ${kb(total.gzip)} gzipped — budget ${BUDGET_KB_GZ} kB gz: ${total.gzip <= BUDGET_KB_GZ * 1024 ? 'met' : 'NOT met'}\n`,
  );
  for (const chunk of initial) process.stdout.write(`  ${chunk.file.padEnd(48)} ${kb(chunk.raw).padStart(10)} ${kb(chunk.gzip).padStart(10)} gz\n`);
  if (initialCss.length > 0) process.stdout.write(`initial CSS: ${initialCss.map((css) => `${css.file} ${kb(css.raw)} (${kb(css.gzip)} gz)`).join(', ')}\n`);
  const initialSet = new Set(initial.map((chunk) => chunk.file));
  const scripts = allFiles(distDir).filter((file) => file.endsWith('.js')).map(sizeOf).sort((a, b) => b.raw - a.raw);
  const everything = scripts.reduce((sum, chunk) => sum + chunk.gzip, 0);
  process.stdout.write(`all JavaScript: ${scripts.length} files, ${kb(everything)} gz; the largest:\n`);
  for (const chunk of scripts.slice(0, 10)) {
    process.stdout.write(`  ${chunk.file.padEnd(48)} ${kb(chunk.raw).padStart(10)} ${kb(chunk.gzip).padStart(10)} gz${initialSet.has(chunk.file) ? '  (initial)' : '  (lazy)'}\n`);
  }
}

async function startStack(): Promise<{ url: string; stop(): Promise<void> }> {
  const dataDir = join(tmpdir(), `statorline-client-bench-${process.pid}`);
  const port = 3400 + Math.floor(Math.random() * 400);
  const env = {
    ...process.env,
    DATA_DIR: dataDir,
    PG_PORT: String(55500 + Math.floor(Math.random() * 400)),
    PORT: String(port),
    SMTP_CATCHER_PORT: String(25300 + Math.floor(Math.random() * 400)),
    STATORLINE_DIST: DIST,
    LOG_LEVEL: 'warn',
  };
  const child = spawn(process.execPath, ['--import', 'tsx', 'server/cli/start.ts'], { cwd: projectRoot, env, stdio: ['ignore', 'pipe', 'inherit'] });
  const exited = new Promise<void>((resolve) => child.once('exit', () => resolve()));
  await new Promise<void>((resolve, reject) => {
    let output = '';
    const timer = setTimeout(() => reject(new Error('the stack did not start within 5 minutes')), 300_000);
    child.stdout!.on('data', (data: Buffer) => {
      output += data.toString();
      if (output.includes('Statorline is ready')) {
        clearTimeout(timer);
        resolve();
      }
    });
    child.once('exit', (code) => reject(new Error(`the stack exited with ${code} before it was ready`)));
  });
  return {
    url: `http://127.0.0.1:${port}`,
    async stop() {
      child.kill('SIGINT');
      await exited;
      rmSync(dataDir, { recursive: true, force: true });
    },
  };
}

const median = (values: number[]) => [...values].sort((a, b) => a - b)[Math.floor(values.length / 2)]!;

async function measureInteractive(url: string): Promise<void> {
  // One sign-in; each cold load then starts a fresh profile (empty cache) carrying only the cookie.
  const first = await launchBrowser();
  let cookies;
  try {
    await first.page.goto(`${url}/`);
    await first.page.locator('input[data-testid="signin-email"], [data-testid="signin-email"] input').first().fill('engineer@kestrel.example');
    await first.page.locator('input[data-testid="signin-password"], [data-testid="signin-password"] input').first().fill(DEMO_PASSWORD);
    await first.page.getByTestId('signin-submit').click();
    await first.page.waitForURL((address) => !address.pathname.startsWith('/sign-in'), { timeout: 60_000 });
    cookies = await first.context.cookies();
  } finally {
    await first.close();
  }
  const runs: Array<{ interactive: number; domContentLoaded: number; load: number; rows: number; scripts: number; scriptBytes: number; scriptTransfer: number }> = [];
  for (let run = 0; run < RUNS; run += 1) {
    const browser = await launchBrowser();
    try {
      await browser.context.addCookies(cookies);
      await browser.page.goto(`${url}/motors`, { waitUntil: 'commit' });
      // Polled every animation frame; performance.now() in the page counts from navigation start.
      const interactive = await browser.page.waitForFunction(
        () => {
          const rows = document.querySelectorAll('[data-testid="motors-table"] tbody tr:not(.q-table__bottom)');
          const search = document.querySelector<HTMLInputElement>('input[data-testid="motors-search"], [data-testid="motors-search"] input');
          const loading = document.querySelector('[data-testid="motors-table"] .q-linear-progress');
          return rows.length > 0 && search !== null && !search.disabled && loading === null ? { at: performance.now(), rows: rows.length } : false;
        },
        undefined,
        { polling: 'raf', timeout: 60_000 },
      );
      const { at, rows } = (await interactive.jsonValue()) as { at: number; rows: number };
      await browser.page.waitForLoadState('load');
      const timing = await browser.page.evaluate((until) => {
        const entry = performance.getEntriesByType('navigation')[0] as PerformanceNavigationTiming;
        // Every script fetched before the register was interactive (initial + the lazy layout and page).
        const scripts = (performance.getEntriesByType('resource') as PerformanceResourceTiming[]).filter((resource) => /\.js(\?|$)/.test(resource.name) && resource.startTime <= until);
        return {
          domContentLoaded: entry.domContentLoadedEventEnd,
          load: entry.loadEventEnd,
          scripts: scripts.length,
          scriptBytes: scripts.reduce((sum, resource) => sum + resource.encodedBodySize, 0),
          scriptTransfer: scripts.reduce((sum, resource) => sum + resource.transferSize, 0),
        };
      }, at);
      if (browser.problems.length > 0) process.stdout.write(`  run ${run + 1}: console problems: ${browser.problems.join(' | ')}\n`);
      runs.push({ interactive: at, rows, ...timing });
    } finally {
      await browser.close();
    }
  }
  const ms = (value: number) => `${value.toFixed(0)} ms`;
  process.stdout.write(
    `Motor register interactive (rows rendered, search enabled), median of ${RUNS} cold loads: ${ms(median(runs.map((r) => r.interactive)))}; domContentLoaded ${ms(median(runs.map((r) => r.domContentLoaded)))}, load ${ms(median(runs.map((r) => r.load)))}\n`,
  );
  for (const [index, r] of runs.entries()) {
    process.stdout.write(
      `  run ${index + 1}: interactive ${ms(r.interactive)} (${r.rows} rows), domContentLoaded ${ms(r.domContentLoaded)}, load ${ms(r.load)}; ${r.scripts} scripts fetched before interactive, ${kb(r.scriptBytes)} as sent (${kb(r.scriptTransfer)} with headers)\n`,
    );
  }
}

async function main(): Promise<void> {
  process.stdout.write(`load average ${loadavg().map((v) => v.toFixed(1)).join(' ')}\n`);
  build();
  reportSizes();
  if (process.env.CLIENT_SKIP_BROWSER === '1') return;
  const stack = await startStack();
  try {
    await measureInteractive(stack.url);
  } finally {
    await stack.stop();
  }
  process.stdout.write(`load average at end ${loadavg().map((v) => v.toFixed(1)).join(' ')}\n`);
}

if (process.argv[1]?.endsWith('client.bench.ts')) {
  main().catch((error: unknown) => {
    process.stderr.write(`${error instanceof Error ? (error.stack ?? error.message) : String(error)}\n`);
    process.exit(1);
  });
}
