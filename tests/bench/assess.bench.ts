/**
 * `npm run bench -- assess`: assesses 100,000 generated motors against every option with an 8-bin
 * duty profile and prints motors per second and peak memory. Goal (issue 3): at least 50,000 motors/s.
 *
 * It runs three modes, each in its own child process (so each mode's peak memory is its own):
 * - mode full: `assess(motor, site)` one motor at a time, every option with its 8 per-bin results and
 *   its assumptions (what the server, CLI and client get);
 * - mode totals: `assess(motor, site, undefined, undefined, { detail: 'totals' })`, every option and
 *   every bin still evaluated, only the per-bin result objects left out;
 * - mode screening: `screenMotors(chunk, site)` on chunks of 1,000 motors: the same figures, computed
 *   by the same core, written into typed-array columns, with no assumption lists, text or result
 *   objects; what depends only on the site is worked out once per chunk. Its checksum equals the
 *   other modes' (the same baseline kWh and last-option NPV per motor).
 * For each it prints motors per second of wall clock and per CPU second (process.cpuUsage user +
 * system over the timed loop; JavaScript runs on one thread, the figure also counts V8's GC helper
 * threads), peak RSS (sampled after every chunk of 1,000 motors), and the load average when the
 * mode started, so a reader can judge the machine: on a shared machine the wall-clock rate falls
 * with the load while the per-CPU-second rate mostly does not.
 * The motors come from a seeded generator, so every run assesses the same set; half of them are fans
 * or pumps with a throttle, damper, vanes or on/off control, so they get all 12 options.
 * Before the clock starts, 10,000 other varied motors warm the JIT up. `BENCH_MOTORS=n` changes the
 * count; `BENCH_DETAIL=full|totals|screening` runs one mode in this process.
 */
import { spawnSync } from 'node:child_process';
import { cpus, loadavg } from 'node:os';
import { fileURLToPath } from 'node:url';
import { assess, type AssessOptions } from '../../calc/assess/assess.js';
import { OPTION_SLOTS, screenMotors } from '../../calc/assess/screen.js';
import type { MotorInput, SiteInput } from '../../calc/assess/schema.js';
import { seededRandom } from '../support/random.js';

const MOTORS = Number(process.env.BENCH_MOTORS ?? 100_000);
const GOAL = 50_000;
const RATINGS = [0.37, 0.75, 1.5, 3, 5.5, 7.5, 11, 15, 22, 37, 55, 75, 110, 160, 250, 400];
const APPLICATIONS = ['fan', 'pump', 'compressor', 'conveyor'] as const;
const CONTROLS = ['direct-on-line', 'throttle-valve', 'outlet-damper', 'inlet-vanes'] as const;
const CLASSES = ['IE1', 'IE2', 'IE3', 'unknown'] as const;

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
/** Chunks assessed before the timing starts [-]. */
const WARM_UP_CHUNKS = 10;
const fmt = (value: number): string => Math.round(value).toLocaleString('en');

type Mode = 'full' | 'totals' | 'screening';
const MODES: readonly Mode[] = ['full', 'totals', 'screening'];
const MODE_DESCRIPTIONS: Readonly<Record<Mode, string>> = {
  full: 'assess, one motor at a time, per-bin results built for every option',
  totals: "assess with detail: 'totals': every option and bin evaluated, per-bin objects left out",
  screening: 'screenMotors on chunks of 1,000 motors: the same figures into typed-array columns, no text, no result objects',
};

/** Assesses one chunk in the mode; adds to the counters. */
function assessChunk(chunk: MotorInput[], mode: Mode, options: AssessOptions, counters: { options: number; bins: number; checksum: number }): void {
  if (mode === 'screening') {
    const screening = screenMotors(chunk, site);
    const { annualKwh, npv } = screening.figures;
    for (let index = 0; index < chunk.length; index += 1) {
      const count = screening.optionCount[index]!;
      const first = index * OPTION_SLOTS;
      counters.options += count;
      // The same checksum as the assess modes: baseline kWh + the last option's NPV.
      counters.checksum += annualKwh[first]! + npv[first + (count === OPTION_SLOTS ? OPTION_SLOTS - 1 : OPTION_SLOTS / 2 - 1)]!;
    }
    return;
  }
  for (const motor of chunk) {
    const result = assess(motor, site, undefined, undefined, options);
    counters.options += result.options.length;
    counters.bins += result.baseline.bins.length;
    counters.checksum += result.baseline.annualKwh + result.options[result.options.length - 1]!.npv;
  }
}

function runMode(mode: Mode): void {
  const detail = mode === 'full' ? 'full' : 'totals';
  const options: AssessOptions = { detail };
  const loadAtStart = loadavg();
  const random = seededRandom(20261201);
  // Warm up the JIT outside the timing, on varied motors of their own seed: every path (fans, pumps,
  // each control, class and rewind count) must be compiled before the clock starts, or the timed
  // loop pays for tiering up and deoptimising (one chunk of identical motors did not do that).
  const warmUp = seededRandom(1);
  for (let round = 0; round < WARM_UP_CHUNKS; round += 1) {
    assessChunk(
      Array.from({ length: CHUNK }, (_, index) => makeMotor(warmUp, index)),
      mode,
      options,
      { options: 0, bins: 0, checksum: 0 },
    );
  }

  let peakRss = process.memoryUsage().rss;
  const counters = { options: 0, bins: 0, checksum: 0 };
  let nanoseconds = 0n;
  let cpuMicroseconds = 0;
  for (let first = 0; first < MOTORS; first += CHUNK) {
    const chunk = Array.from({ length: Math.min(CHUNK, MOTORS - first) }, (_, index) => makeMotor(random, first + index));
    const start = process.hrtime.bigint();
    const cpuStart = process.cpuUsage();
    assessChunk(chunk, mode, options, counters);
    nanoseconds += process.hrtime.bigint() - start;
    const cpu = process.cpuUsage(cpuStart);
    cpuMicroseconds += cpu.user + cpu.system;
    peakRss = Math.max(peakRss, process.memoryUsage().rss);
  }
  const { options: optionCount, bins: binCount, checksum } = counters;
  const seconds = Number(nanoseconds) / 1e9;
  const perSecond = MOTORS / seconds;
  const perCpuSecond = MOTORS / (cpuMicroseconds / 1e6);
  process.stdout.write(
    [
      `mode                  ${mode} (${MODE_DESCRIPTIONS[mode]})`,
      `load average at start ${loadAtStart.map((value) => value.toFixed(2)).join(' ')} on ${cpus().length} cores (now ${loadavg()[0]!.toFixed(2)})`,
      `motors assessed       ${fmt(MOTORS)}; options ${fmt(optionCount)} (${(optionCount / MOTORS).toFixed(2)} per motor), bins per option ${mode === 'full' ? (binCount / MOTORS).toFixed(0) : '8 evaluated, 0 returned'}`,
      `time                  ${seconds.toFixed(2)} s wall, ${(cpuMicroseconds / 1e6).toFixed(2)} s CPU (${(cpuMicroseconds / MOTORS).toFixed(1)} µs CPU per motor)`,
      `motors per second     ${fmt(perSecond)} wall clock (goal ${fmt(GOAL)}: ${perSecond >= GOAL ? 'met' : 'NOT met'})`,
      `motors per CPU second ${fmt(perCpuSecond)} (goal ${fmt(GOAL)}: ${perCpuSecond >= GOAL ? 'met' : 'NOT met'}; less sensitive to load than wall clock, still slowed by a busy shared core)`,
      `peak memory (rss)     ${(peakRss / 1024 / 1024).toFixed(0)} MiB`,
      `checksum              ${checksum.toExponential(9)}`,
      `${RESULT_MARK}${JSON.stringify({ mode, perSecond, perCpuSecond })}`,
    ].join('\n') + '\n',
  );
}

/** Marks the line a mode's process ends with, read by the parent for the verdict and left out of the print. */
const RESULT_MARK = '@result ';

const only = process.env.BENCH_DETAIL;
if (only === 'full' || only === 'totals' || only === 'screening') {
  runMode(only);
} else {
  process.stdout.write(`assess benchmark: ${fmt(MOTORS)} motors × every option × 8-bin duty profile, Node ${process.version}, one JavaScript thread\n`);
  const results: { mode: Mode; perSecond: number; perCpuSecond: number }[] = [];
  for (const mode of MODES) {
    process.stdout.write('\n');
    const run = spawnSync(process.execPath, [...process.execArgv, fileURLToPath(import.meta.url)], {
      stdio: ['inherit', 'pipe', 'inherit'],
      encoding: 'utf8',
      env: { ...process.env, BENCH_DETAIL: mode },
    });
    if (run.status !== 0) {
      process.stdout.write(run.stdout ?? '');
      process.exit(run.status ?? 1);
    }
    for (const line of run.stdout.split('\n')) {
      if (line.startsWith(RESULT_MARK)) results.push(JSON.parse(line.slice(RESULT_MARK.length)) as (typeof results)[number]);
      else if (line !== '') process.stdout.write(`${line}\n`);
    }
  }
  // The verdict, plainly: which modes reach the goal, by wall clock and per CPU second.
  const verdict = (key: 'perSecond' | 'perCpuSecond'): string => {
    const met = results.filter((result) => result[key] >= GOAL).map((result) => result.mode);
    const figures = results.map((result) => `${result.mode} ${fmt(result[key])}`).join(', ');
    if (met.length === 0) return `NOT met by any mode (${figures})`;
    if (met.length === results.length) return `met by every mode (${figures})`;
    return `met only by ${met.join(' and ')}, not by ${results.filter((result) => !met.includes(result.mode)).map((result) => result.mode).join(' or ')} (${figures})`;
  };
  process.stdout.write(`\ngoal ${fmt(GOAL)} motors/s, per CPU second: ${verdict('perCpuSecond')}\n`);
  process.stdout.write(`goal ${fmt(GOAL)} motors/s, wall clock:     ${verdict('perSecond')}\n`);
}
