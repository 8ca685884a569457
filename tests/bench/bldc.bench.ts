/**
 * `npm run bench -- bldc`: time of one analytic BLDC design (fixed slot/pole combination, full
 * evaluation with waveforms and part-load curve) and of a full slot/pole search, on one core.
 */
import { analyseWinding } from '../../calc/bldc/electrical.js';
import { evaluateDesign } from '../../calc/bldc/design.js';
import { resolveSpec, sizeBldc } from '../../calc/bldc/search.js';
import { windingLayout } from '../../calc/bldc/winding.js';

function median(values: number[]): number {
  const sorted = [...values].sort((a, b) => a - b);
  return sorted[Math.floor(sorted.length / 2)] ?? 0;
}

const spec = resolveSpec({ ratedPowerKw: 11, speedRpm: 1500, supplyVoltageV: 400, frequencyHz: 50 });
const analysis = analyseWinding(windingLayout(36, 4, 2, 9));
const candidate = { splitRatio: 0.6, outerDiameterM: spec.frame.maxStatorOuterDiameterMm / 1000, stack: { kind: 'current-density' as const, fraction: 1 } };
for (let i = 0; i < 200; i += 1) evaluateDesign(spec, analysis, candidate, true);
const one: number[] = [];
for (let i = 0; i < 2000; i += 1) {
  const t0 = performance.now();
  evaluateDesign(spec, analysis, candidate, true);
  one.push(performance.now() - t0);
}
process.stdout.write(`one design (11 kW, 36/4, full output): median ${(median(one) * 1000).toFixed(0)} µs, mean ${((one.reduce((a, b) => a + b, 0) / one.length) * 1000).toFixed(0)} µs\n`);

const t1 = performance.now();
const fixed = sizeBldc({ ratedPowerKw: 11, speedRpm: 1500, supplyVoltageV: 400, frequencyHz: 50, slots: 36, poles: 4 });
process.stdout.write(`size-bldc with slots/poles fixed: ${(performance.now() - t1).toFixed(1)} ms (${fixed.search.candidatesEvaluated} candidates)\n`);

for (const [kw, rpm] of [[11, 1500], [0.37, 3000], [160, 1000]] as const) {
  const runs: number[] = [];
  const cpuRuns: number[] = [];
  let evaluated = 0;
  let combinations = 0;
  for (let i = 0; i < 3; i += 1) {
    const t0 = performance.now();
    const c0 = process.cpuUsage();
    const r = sizeBldc({ ratedPowerKw: kw, speedRpm: rpm, supplyVoltageV: 400, frequencyHz: 50 });
    const c1 = process.cpuUsage(c0);
    cpuRuns.push((c1.user + c1.system) / 1000);
    runs.push(performance.now() - t0);
    evaluated = r.search.candidatesEvaluated;
    combinations = r.search.combinations;
  }
  process.stdout.write(`full search ${kw} kW ${rpm} rpm: median ${median(runs).toFixed(0)} ms wall, ${median(cpuRuns).toFixed(0)} ms CPU (${combinations} slot/pole combinations, ${evaluated} candidates; ${((median(runs) * 1000) / evaluated).toFixed(0)} µs per candidate)\n`);
}
const usage = process.cpuUsage();
process.stdout.write(`process CPU ${(usage.user / 1000).toFixed(0)} ms user; peak RSS ${(process.memoryUsage().rss / 2 ** 20).toFixed(0)} MiB\n`);
