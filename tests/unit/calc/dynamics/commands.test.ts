import { Worker } from 'node:worker_threads';
import { describe, expect, it } from 'vitest';
import { commands } from '../../../../calc/commands.js';
import { runSimulateCommand } from '../../../../calc/dynamics/commands.js';
import { createWorkerHandler, type WorkerResponse } from '../../../../calc/dynamics/worker-protocol.js';

const simulationParams = {
  phaseResistanceOhm: 0.5,
  phaseInductanceH: 2e-3,
  mutualInductanceH: -0.5e-3,
  backEmfConstantVsPerRad: 0.25,
  polePairs: 2,
  inertiaKgM2: 2e-3,
  viscousFrictionNmsPerRad: 1e-4,
  dcBusV: 300,
};
const input = { design: { simulationParams, name: 'hand-made' }, load: { kind: 'constant', torqueNm: 0.5 }, durationS: 0.01, stepS: 2e-6, outputPoints: 50 };

describe('simulate command', () => {
  it('accepts a design with simulationParams, defaults the flat top to 120° and returns plain arrays', () => {
    const output = commands.simulate!.run(input) as ReturnType<typeof runSimulateCommand>;
    expect(output.series.timeS.length).toBe(output.series.speedRpm.length);
    expect(output.series.timeS.length).toBeLessThanOrEqual(51);
    expect(Array.isArray(output.series.phaseCurrentAA)).toBe(true);
    expect(output.summary.finalSpeedRpm).toBeGreaterThan(0);
    expect(JSON.parse(JSON.stringify(output)).summary.peakPhaseCurrentA).toBe(output.summary.peakPhaseCurrentA);
  });

  it('names the field of the design when its parameters are wrong', () => {
    expect(() => runSimulateCommand({ ...input, design: { simulationParams: { ...simulationParams, inertiaKgM2: 0 } } })).toThrow(
      '"design.simulationParams.inertiaKgM2" must be positive',
    );
    expect(() => runSimulateCommand({ load: input.load, durationS: 0.01 })).toThrow('"params" is required (or design with simulationParams)');
  });
});

describe('simulation worker', () => {
  it('posts progress, then the result (protocol handler)', async () => {
    const messages: WorkerResponse[] = [];
    const handle = createWorkerHandler((message) => messages.push(message), () => Promise.resolve(), 1000);
    await handle({ type: 'start', input });
    const progress = messages.filter((message) => message.type === 'progress');
    expect(progress).toHaveLength(5);
    expect(messages.at(-1)?.type).toBe('result');
  });

  it('answers a cancel with cancelled, and bad input with the field', async () => {
    const messages: WorkerResponse[] = [];
    let handle: ReturnType<typeof createWorkerHandler> | undefined;
    let yields = 0;
    handle = createWorkerHandler((message) => messages.push(message), async () => {
      yields += 1;
      if (yields === 2) await handle?.({ type: 'cancel' });
    }, 500);
    await handle({ type: 'start', input });
    expect(messages.at(-1)).toEqual({ type: 'cancelled' });
    messages.length = 0;
    await handle({ type: 'start', input: { ...input, durationS: -1 } });
    expect(messages).toEqual([{ type: 'error', message: '"durationS" must be positive', field: 'durationS' }]);
  });

  it('runs as a Node worker_threads script', async () => {
    // The server starts it the same way: register the TypeScript loader, then import the entry file.
    const entry = new URL('../../../../calc/dynamics/worker.ts', import.meta.url).href;
    const loader = new URL('../../../../node_modules/tsx/dist/esm/api/index.mjs', import.meta.url).href;
    const bootstrap = `import(${JSON.stringify(loader)}).then((tsx) => { tsx.register(); return import(${JSON.stringify(entry)}); })`;
    const worker = new Worker(bootstrap, { eval: true });
    const messages: WorkerResponse[] = [];
    const done = new Promise<void>((resolve, reject) => {
      worker.on('message', (message: WorkerResponse) => {
        messages.push(message);
        if (message.type === 'result' || message.type === 'error') resolve();
      });
      worker.on('error', reject);
    });
    worker.postMessage({ type: 'start', input });
    await done;
    await worker.terminate();
    expect(messages.at(-1)?.type).toBe('result');
    expect(messages.some((message) => message.type === 'progress')).toBe(true);
  }, 30_000);
});
