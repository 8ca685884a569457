/**
 * `npm run bench -- dynamics`: time of one second of simulated start-up at a 1 µs step (goal under
 * 0.25 s on one core) in the drive modes, and of a 40 × 40 efficiency map (goal under 0.5 s).
 * Each figure is the best of a few runs after a warm-up run, so JIT compilation is not counted.
 */
import type { BldcLossModel, BldcSimulationParams } from '../../calc/contracts.js';
import { efficiencyMap } from '../../calc/dynamics/efficiency-map.js';
import { simulate, type SimulationInput } from '../../calc/dynamics/simulate.js';

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

function best(runs: number, work: () => void): number {
  let fastest = Infinity;
  for (let i = 0; i < runs; i++) {
    const start = performance.now();
    work();
    fastest = Math.min(fastest, performance.now() - start);
  }
  return fastest / 1000;
}

const base: SimulationInput = { params, load: { kind: 'quadratic', torqueNm: 2, atSpeedRpm: 3000 }, durationS: 1, stepS: 1e-6 };
const cases: [string, Partial<SimulationInput>][] = [
  ['full bus, averaged', {}],
  ['speed + current PI, averaged PWM', { setSpeedRpm: 3000, currentLimitA: 20 }],
  ['speed + current PI, switched PWM 20 kHz', { setSpeedRpm: 3000, currentLimitA: 20, pwm: { mode: 'switched', frequencyHz: 20_000 } }],
  ['speed loop + hysteresis', { setSpeedRpm: 3000, currentLimitA: 20, currentControl: 'hysteresis' }],
  ['full bus from rectifier + DC link', { supply: { kind: 'rectifier', lineVoltageV: 230, frequencyHz: 50, capacitanceF: 1e-3 } }],
];
simulate({ ...base, durationS: 0.2 });
for (const [name, extra] of cases) {
  let steps = 0;
  let events = 0;
  const seconds = best(2, () => {
    const result = simulate({ ...base, ...extra });
    steps = result.stats.steps;
    events = result.stats.stateEvents + result.stats.timeEvents;
  });
  process.stdout.write(`simulate 1 s at 1 µs (${name}): ${seconds.toFixed(3)} s, ${((seconds / steps) * 1e9).toFixed(0)} ns/step, ${events} events (goal < 0.25 s)\n`);
}

const lossModel: BldcLossModel = {
  ratedSpeedRpm: 1500, ratedTorqueNm: 19.1, maxSpeedRpm: 2000, maxContinuousTorqueNm: 20, peakTorqueNm: 40, dcBusV: 540, polePairs: 4,
  phaseResistanceOhm: 0.4, torqueConstantNmPerA: 2.45, backEmfConstantVsPerRad: 1.0, ironHysteresisAtRatedW: 40, ironEddyAtRatedW: 20,
  magnetEddyAtRatedW: 5, frictionAtRatedW: 10, windageAtRatedW: 8, drive: { fixedW: 15, perAmpereW: 6, perAmpereSquaredOhm: 0.05 },
};
const speeds = Array.from({ length: 40 }, (_, i) => i * 55);
const torques = Array.from({ length: 40 }, (_, i) => i * 1.05);
efficiencyMap(lossModel, speeds, torques);
const mapSeconds = best(20, () => efficiencyMap(lossModel, speeds, torques));
process.stdout.write(`efficiency map 40 × 40: ${(mapSeconds * 1000).toFixed(2)} ms (goal < 500 ms)\n`);
process.stdout.write(`peak resident memory: ${(process.memoryUsage().rss / 2 ** 20).toFixed(0)} MiB\n`);
