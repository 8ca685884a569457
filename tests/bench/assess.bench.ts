/**
 * `npm run bench -- assess`: assesses 100,000 generated motors against every option with an 8-bin
 * duty profile on one core, and prints motors per second and peak memory (max of
 * process.memoryUsage().rss sampled after every chunk of 1,000 motors). Goal (issue 3): at least 50,000 motors/s.
 * The motors come from a seeded generator, so every run assesses the same set; half of them are fans
 * or pumps with a throttle, damper, vanes or on/off control, so they get all 12 options.
 */
import { cpus, loadavg } from 'node:os';
import { assess } from '../../calc/assess/assess.js';
import type { MotorInput, SiteInput } from '../../calc/assess/schema.js';

const MOTORS = Number(process.env.BENCH_MOTORS ?? 100_000);
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
const random = generator(20261201);
/** Motors are generated in chunks outside the timing, so the input set never sits whole in memory. */
const CHUNK = 1000;

// Warm up the JIT on one chunk, outside the timing.
for (const motor of Array.from({ length: CHUNK }, (_, index) => makeMotor(generator(1), index))) assess(motor, site);

let peakRss = process.memoryUsage().rss;
let options = 0;
let checksum = 0;
let nanoseconds = 0n;
let cpuMicroseconds = 0;
for (let first = 0; first < MOTORS; first += CHUNK) {
  const chunk = Array.from({ length: Math.min(CHUNK, MOTORS - first) }, (_, index) => makeMotor(random, first + index));
  const start = process.hrtime.bigint();
  const cpuStart = process.cpuUsage();
  for (const motor of chunk) {
    const result = assess(motor, site);
    options += result.options.length;
    checksum += result.baseline.annualKwh;
  }
  nanoseconds += process.hrtime.bigint() - start;
  const cpu = process.cpuUsage(cpuStart);
  cpuMicroseconds += cpu.user + cpu.system;
  peakRss = Math.max(peakRss, process.memoryUsage().rss);
}
const seconds = Number(nanoseconds) / 1e9;
peakRss = Math.max(peakRss, process.memoryUsage().rss);

const perSecond = MOTORS / seconds;
const perCpuSecond = MOTORS / (cpuMicroseconds / 1e6);
process.stdout.write(
  [
    `motors assessed      ${MOTORS.toLocaleString('en')}`,
    `options evaluated    ${options.toLocaleString('en')} (${(options / MOTORS).toFixed(2)} per motor, 8 bins each)`,
    `time                 ${seconds.toFixed(2)} s on one core`,
    `motors per second    ${Math.round(perSecond).toLocaleString('en')} wall clock (goal 50,000: ${perSecond >= 50_000 ? 'met' : 'NOT met'})`,
    `motors per CPU second ${Math.round(perCpuSecond).toLocaleString('en')} (process CPU time, GC threads included; differs from wall clock when the machine is busy)`,
    `load average         ${loadavg().map((value) => value.toFixed(2)).join(' ')} on ${cpus().length} cores`,
    `peak memory (rss)    ${(peakRss / 1024 / 1024).toFixed(0)} MiB`,
    `checksum (baseline kWh) ${checksum.toExponential(6)}`,
  ].join('\n') + '\n',
);
