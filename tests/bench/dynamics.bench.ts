/**
 * `npm run bench -- dynamics`: time of one second of simulated start-up at a 1 µs step (goal under
 * 0.25 s on one core) in the drive modes, and of a 40 × 40 efficiency map (goal under 0.5 s).
 *
 * Honest reporting on a shared machine: every case runs RUNS times after a warm-up run (so JIT
 * compilation is not counted); each run reports wall time and the CPU time of this process
 * (process.cpuUsage, user + system: what one core spent on it, which other processes' load does not
 * inflate as much as wall time). Printed: best and median of each. The load average at the start
 * and at the end is printed too: with a load above the number of cores, wall times are not
 * the program's own.
 */
import { availableParallelism, loadavg } from 'node:os';
import type { BldcLossModel, BldcSimulationParams } from '../../calc/contracts.js';
import { efficiencyMap } from '../../calc/dynamics/efficiency-map.js';
import { simulate, type SimulationInput } from '../../calc/dynamics/simulate.js';

/** Timed runs per case [-]. */
const RUNS = 5;
/** Goal of the issue for 1 s simulated at 1 µs [s]. */
const GOAL_SIMULATE_S = 0.25;

const params: BldcSimulationParams = {
  phaseResistanceOhm: 0.5,
  phaseInductanceH: 2e-3,
  mutualInductanceH: -0.5e-3,
  backEmfConstantVsPerRad: 0.25,
  flatTopElectricalDeg: 120,
  polePairs: 2,
  inertiaKgM2: 2e-3,
  viscousFrictionNmsPerRad: 1e-4,
  dcBusV: 300,
};

interface Timing {
  wallS: number[];
  cpuS: number[];
}

function time(runs: number, work: () => void): Timing {
  const wallS: number[] = [];
  const cpuS: number[] = [];
  for (let i = 0; i < runs; i++) {
    const cpu0 = process.cpuUsage();
    const wall0 = performance.now();
    work();
    const wall = (performance.now() - wall0) / 1000;
    const cpu = process.cpuUsage(cpu0);
    wallS.push(wall);
    cpuS.push((cpu.user + cpu.system) / 1e6);
  }
  return { wallS, cpuS };
}

const best = (values: number[]): number => Math.min(...values);
function median(values: number[]): number {
  const sorted = [...values].sort((a, b) => a - b);
  const middle = sorted.length >> 1;
  return sorted.length % 2 === 1 ? (sorted[middle] as number) : 0.5 * ((sorted[middle - 1] as number) + (sorted[middle] as number));
}
const load = (): string => loadavg().map((value) => value.toFixed(2)).join(' ');

process.stdout.write(`cores ${availableParallelism()}, load average at start ${load()} (1, 5, 15 min); node ${process.version}; ${RUNS} runs per case after a warm-up\n`);

const base: SimulationInput = { params, load: { kind: 'quadratic', torqueNm: 2, atSpeedRpm: 3000 }, durationS: 1, stepS: 1e-6 };
const cases: [string, Partial<SimulationInput>][] = [
  ['full bus, averaged (default)', {}],
  ['speed + current PI, averaged PWM', { setSpeedRpm: 3000, currentLimitA: 20 }],
  ['speed + current PI, switched PWM 20 kHz', { setSpeedRpm: 3000, currentLimitA: 20, pwm: { mode: 'switched', frequencyHz: 20_000 } }],
  ['speed loop + hysteresis', { setSpeedRpm: 3000, currentLimitA: 20, currentControl: 'hysteresis' }],
  ['full bus from rectifier + DC link', { supply: { kind: 'rectifier', lineVoltageV: 230, frequencyHz: 50, capacitanceF: 1e-3 } }],
];
for (const [name, extra] of cases) {
  simulate({ ...base, ...extra, durationS: 0.1 });
  let steps = 0;
  let events = 0;
  const timing = time(RUNS, () => {
    const result = simulate({ ...base, ...extra });
    steps = result.stats.steps;
    events = result.stats.stateEvents + result.stats.timeEvents;
  });
  const cpuBest = best(timing.cpuS);
  const perStep = (seconds: number): string => `${((seconds / steps) * 1e9).toFixed(0)} ns/step`;
  process.stdout.write(
    `simulate 1 s at 1 µs (${name}), ${events} events:\n` +
      `  CPU  best ${cpuBest.toFixed(3)} s (${perStep(cpuBest)}), median ${median(timing.cpuS).toFixed(3)} s (${perStep(median(timing.cpuS))})\n` +
      `  wall best ${best(timing.wallS).toFixed(3)} s, median ${median(timing.wallS).toFixed(3)} s` +
      `  -> goal < ${GOAL_SIMULATE_S} s: ${cpuBest < GOAL_SIMULATE_S ? 'met' : 'NOT met'} (best CPU)\n`,
  );
}

const lossModel: BldcLossModel = {
  ratedSpeedRpm: 1500, ratedTorqueNm: 19.1, maxSpeedRpm: 2000, maxContinuousTorqueNm: 20, peakTorqueNm: 40, dcBusV: 540, polePairs: 4,
  phaseResistanceOhm: 0.4, torqueConstantNmPerA: 2.45, backEmfConstantVsPerRad: 1.0, ironHysteresisAtRatedW: 40, ironEddyAtRatedW: 20,
  magnetEddyAtRatedW: 5, frictionAtRatedW: 10, windageAtRatedW: 8, drive: { fixedW: 15, perAmpereW: 6, perAmpereSquaredOhm: 0.05 },
};
const speeds = Array.from({ length: 40 }, (_, i) => i * 55);
const torques = Array.from({ length: 40 }, (_, i) => i * 1.05);
efficiencyMap(lossModel, speeds, torques);
const map = time(20, () => efficiencyMap(lossModel, speeds, torques));
process.stdout.write(
  `efficiency map 40 × 40: CPU best ${(best(map.cpuS) * 1000).toFixed(2)} ms, median ${(median(map.cpuS) * 1000).toFixed(2)} ms; ` +
    `wall best ${(best(map.wallS) * 1000).toFixed(2)} ms (goal < 500 ms)\n`,
);
process.stdout.write(`load average at end ${load()}; peak resident memory ${(process.memoryUsage().rss / 2 ** 20).toFixed(0)} MiB\n`);
