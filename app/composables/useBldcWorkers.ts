// The BLDC sizing page's Web Workers: the design search and sweeps (calc/bldc) and the start-up
// simulation (calc/dynamics' own worker protocol), each in a worker of its own so the page stays
// responsive, with progress and cancel for the simulation.
import { onBeforeUnmount, ref } from 'vue';
import type { BldcResult, SimulateOutput, SweepRow } from 'shared/design';
import type { WorkerRequest, WorkerResponse } from 'calc/dynamics/worker-protocol';
import type { DesignWorkerRequest, DesignWorkerResponse } from 'src/workers/bldc-design.worker';

/** An input error a worker reports, with the calc field it names. */
export class BldcWorkerError extends Error {
  readonly field: string | null;
  constructor(message: string, field: string | null) {
    super(message);
    this.name = 'BldcWorkerError';
    this.field = field;
  }
}

/** True where the browser can run module workers (not in component tests). */
export function workersAvailable(): boolean {
  return typeof Worker !== 'undefined';
}

function designWorker(): Worker {
  return new Worker(new URL('../workers/bldc-design.worker.ts', import.meta.url), { type: 'module' });
}

function simulationWorker(): Worker {
  return new Worker(new URL('../workers/bldc-simulation.worker.ts', import.meta.url), { type: 'module' });
}

/** Runs calc's `size-bldc` and `sweep` commands in a worker; a new call cancels the running one. */
export function useBldcDesignWorker() {
  const running = ref(false);
  let worker: Worker | null = null;
  let reject: ((error: Error) => void) | null = null;
  let nextId = 1;

  function stop(): void {
    worker?.terminate();
    worker = null;
    running.value = false;
    reject?.(new BldcWorkerError('Stopped.', null));
    reject = null;
  }

  function run<T>(request: Omit<DesignWorkerRequest, 'id'>): Promise<T> {
    stop();
    const id = nextId++;
    const current = designWorker();
    worker = current;
    running.value = true;
    return new Promise<T>((resolve, fail) => {
      reject = fail;
      current.onmessage = (event: MessageEvent<DesignWorkerResponse>) => {
        const answer = event.data;
        if (answer.id !== id) return;
        current.terminate();
        if (worker === current) worker = null;
        running.value = false;
        reject = null;
        if (answer.type === 'result') resolve(answer.result as T);
        else fail(new BldcWorkerError(answer.message, answer.field));
      };
      current.onerror = (event) => {
        current.terminate();
        if (worker === current) worker = null;
        running.value = false;
        reject = null;
        fail(new BldcWorkerError(event.message || 'The design worker failed.', null));
      };
      try {
        // Plain data only: Vue's reactive proxies cannot cross to a worker.
        current.postMessage(JSON.parse(JSON.stringify({ id, ...request })) as DesignWorkerRequest);
      } catch (error) {
        current.terminate();
        if (worker === current) worker = null;
        running.value = false;
        reject = null;
        fail(new BldcWorkerError(error instanceof Error ? error.message : String(error), null));
      }
    });
  }

  onBeforeUnmount(stop);

  return {
    running,
    stop,
    size: (input: unknown) => run<BldcResult>({ type: 'size', input }),
    sweep: (input: unknown) => run<{ parameter: string; rows: SweepRow[] }>({ type: 'sweep', input }),
  };
}

/** Runs calc's `simulate` in a worker with progress (0–1) and cancel. */
export function useSimulationWorker() {
  const running = ref(false);
  const progress = ref(0);
  let worker: Worker | null = null;
  let settle: ((outcome: SimulateOutput | null, error?: Error) => void) | null = null;

  function dispose(): void {
    worker?.terminate();
    worker = null;
    running.value = false;
  }

  /** The result, or null when cancelled. */
  function start(input: unknown): Promise<SimulateOutput | null> {
    dispose();
    const current = simulationWorker();
    worker = current;
    running.value = true;
    progress.value = 0;
    return new Promise<SimulateOutput | null>((resolve, reject) => {
      settle = (outcome, error) => {
        settle = null;
        if (worker === current) dispose();
        else current.terminate();
        if (error) reject(error);
        else resolve(outcome);
      };
      current.onmessage = (event: MessageEvent<WorkerResponse>) => {
        const message = event.data;
        if (message.type === 'progress') progress.value = message.fraction;
        else if (message.type === 'result') {
          progress.value = 1;
          settle?.(message.result);
        } else if (message.type === 'cancelled') settle?.(null);
        else settle?.(null, new BldcWorkerError(message.message, message.field));
      };
      current.onerror = (event) => settle?.(null, new BldcWorkerError(event.message || 'The simulation worker failed.', null));
      try {
        // Plain data only: Vue's reactive proxies cannot cross to a worker.
        current.postMessage({ type: 'start', input: JSON.parse(JSON.stringify(input)) as unknown } satisfies WorkerRequest);
      } catch (error) {
        settle(null, new BldcWorkerError(error instanceof Error ? error.message : String(error), null));
      }
    });
  }

  /** Asks the run to stop at its next chunk; stops the worker outright if it does not answer soon. */
  function cancel(): void {
    if (!worker) return;
    worker.postMessage({ type: 'cancel' } satisfies WorkerRequest);
    const current = worker;
    setTimeout(() => {
      if (worker === current) settle?.(null);
    }, 1500);
  }

  onBeforeUnmount(() => {
    settle?.(null);
    dispose();
  });

  return { running, progress, start, cancel };
}
