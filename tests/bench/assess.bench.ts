/**
 * `npm run bench -- assess`: assesses 100,000 generated motors against every option with an 8-bin
 * duty profile and prints motors per second and peak memory. Goal (issue 3): at least 50,000 motors/s.
 *
 * It runs twice, each in its own child process (so each mode's peak memory is its own):
 * - mode full: `assess(motor, site)`, every option with its 8 per-bin results (what the server returns);
 * - mode totals: `assess(motor, site, undefined, undefined, { detail: 'totals' })`, every option and
 *   every bin still evaluated, only the per-bin result objects left out (screening).
 * For each it prints motors per second of wall clock and per CPU second (process.cpuUsage user +
 * system over the timed loop; JavaScript runs on one thread, the figure also counts V8's GC helper
 * threads), peak RSS (sampled after every chunk of 1,000 motors), and the load average when the
 * mode started, so a reader can judge the machine: on a shared machine the wall-clock rate falls
 * with the load while the per-CPU-second rate mostly does not.
 * The motors come from a seeded generator, so every run assesses the same set; half of them are fans
 * or pumps with a throttle, damper, vanes or on/off control, so they get all 12 options.
 * `BENCH_MOTORS=n` changes the count; `BENCH_DETAIL=full|totals` runs one mode in this process.
 */
import { spawnSync } from 'node:child_process';
import { cpus, loadavg } from 'node:os';
import { fileURLToPath } from 'node:url';
import { assess, type AssessOptions } from '../../calc/assess/assess.js';
import type { MotorInput, SiteInput } from '../../calc/assess/schema.js';

const MOTORS = Number(process.env.BENCH_MOTORS ?? 100_000);
const GOAL = 50_000;
const RATINGS = [0.37, 0.75, 1.5, 3, 5.5, 7.5, 11, 15, 22, 37, 55, 75, 110, 160, 250, 400];
const APPLICATIONS = ['fan', 'pump', 'compressor', 'conveyor'] as const;
const CONTROLS = ['direct-on-line', 'throttle-valve', 'outlet-damper', 'inlet-vanes'] as const;
const CLASSES = ['IE1', 'IE2', 'IE3', 'unknown'] as const;

/** mulberry32: a small seeded generator, so the benchmark is repeatable. */
function generator(seed: number): () => number {
  let state = seed >>> 0;
  return () => {
    state = (state + 0x6d2b79f5) >>> 0;
    let t = state;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

function pick<T>(random: () => number, list: readonly T[]): T {
  return list[Math.floor(random() * list.length)]!;
}

function makeMotor(random: () => number, index: number): MotorInput {
  const application = pick(random, APPLICATIONS);
  const dutyProfile = Array.from({ length: 8 }, (_, bin) => ({ fraction: 0.3 + 0.1 * bin, hours: Math.round(200 + random() * 800) }));
  return {
    tag: `M-${index}`,
    ratedPowerKw: pick(random, RATINGS),
    poles: pick(random, [2, 4, 4, 6, 8] as const),
    application,
    controlMethod: application === 'fan' || application === 'pump' ? pick(random, CONTROLS) : 'direct-on-line',
    efficiencyClass: pick(random, CLASSES),
    loadFactor: 0.5 + random() * 0.4,
    rewinds: Math.floor(random() * 3),
    dutyProfile,
  };
}

const site: SiteInput = { voltageV: 400, frequencyHz: 50, energyPricePerKwh: 0.14, demandChargePerKwMonth: 6, currency: 'EUR', co2KgPerKwh: 0.35 };
/** Motors are generated in chunks outside the timing, so the input set never sits whole in memory. */
const CHUNK = 1000;
const fmt = (value: number): string => Math.round(value).toLocaleString('en');

function runMode(detail: 'full' | 'totals'): void {
  const options: AssessOptions = { detail };
  const loadAtStart = loadavg();
  const random = generator(20261201);
  // Warm up the JIT on one chunk, outside the timing.
  for (const motor of Array.from({ length: CHUNK }, (_, index) => makeMotor(generator(1), index))) assess(motor, site, undefined, undefined, options);

  let peakRss = process.memoryUsage().rss;
  let optionCount = 0;
  let binCount = 0;
  let checksum = 0;
  let nanoseconds = 0n;
  let cpuMicroseconds = 0;
  for (let first = 0; first < MOTORS; first += CHUNK) {
    const chunk = Array.from({ length: Math.min(CHUNK, MOTORS - first) }, (_, index) => makeMotor(random, first + index));
    const start = process.hrtime.bigint();
    const cpuStart = process.cpuUsage();
    for (const motor of chunk) {
      const result = assess(motor, site, undefined, undefined, options);
      optionCount += result.options.length;
      binCount += result.baseline.bins.length;
      checksum += result.baseline.annualKwh + result.options[result.options.length - 1]!.npv;
    }
    nanoseconds += process.hrtime.bigint() - start;
    const cpu = process.cpuUsage(cpuStart);
    cpuMicroseconds += cpu.user + cpu.system;
    peakRss = Math.max(peakRss, process.memoryUsage().rss);
  }
  const seconds = Number(nanoseconds) / 1e9;
  const perSecond = MOTORS / seconds;
  const perCpuSecond = MOTORS / (cpuMicroseconds / 1e6);
  process.stdout.write(
    [
      `mode                  ${detail}${detail === 'full' ? ' (per-bin results built for every option)' : " (detail: 'totals': every option and bin evaluated, per-bin objects left out)"}`,
      `load average at start ${loadAtStart.map((value) => value.toFixed(2)).join(' ')} on ${cpus().length} cores (now ${loadavg()[0]!.toFixed(2)})`,
      `motors assessed       ${fmt(MOTORS)}; options ${fmt(optionCount)} (${(optionCount / MOTORS).toFixed(2)} per motor), bins per option ${detail === 'full' ? (binCount / MOTORS).toFixed(0) : '8 evaluated, 0 returned'}`,
      `time                  ${seconds.toFixed(2)} s wall, ${(cpuMicroseconds / 1e6).toFixed(2)} s CPU (${(cpuMicroseconds / MOTORS).toFixed(1)} µs CPU per motor)`,
      `motors per second     ${fmt(perSecond)} wall clock (goal ${fmt(GOAL)}: ${perSecond >= GOAL ? 'met' : 'NOT met'})`,
      `motors per CPU second ${fmt(perCpuSecond)} (goal ${fmt(GOAL)}: ${perCpuSecond >= GOAL ? 'met' : 'NOT met'}; less sensitive to load than wall clock, still slowed by a busy shared core)`,
      `peak memory (rss)     ${(peakRss / 1024 / 1024).toFixed(0)} MiB`,
      `checksum              ${checksum.toExponential(9)}`,
    ].join('\n') + '\n',
  );
}

const only = process.env.BENCH_DETAIL;
if (only === 'full' || only === 'totals') {
  runMode(only);
} else {
  process.stdout.write(`assess benchmark: ${fmt(MOTORS)} motors × every option × 8-bin duty profile, Node ${process.version}, one JavaScript thread\n`);
  for (const detail of ['full', 'totals'] as const) {
    process.stdout.write('\n');
    const run = spawnSync(process.execPath, [...process.execArgv, fileURLToPath(import.meta.url)], {
      stdio: 'inherit',
      env: { ...process.env, BENCH_DETAIL: detail },
    });
    if (run.status !== 0) process.exit(run.status ?? 1);
  }
}
