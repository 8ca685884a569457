/**
 * A small pool of calc worker threads (calc-worker.ts) with a time limit per task. A task over its
 * limit gets its worker terminated (the only way to stop synchronous calc code) and answers 413.
 * Under tsx (tests, `npm start`) a worker cannot load a .ts entry by itself: it is started from a
 * bootstrap that registers tsx's loader first, as tests/unit/calc/dynamics does.
 */
import { Worker } from 'node:worker_threads';
import { CalcInputError } from '../../calc/errors.js';
import { AppError, tooLarge } from '../lib/errors.js';
import type { CalcWorkerRequest, CalcWorkerResponse } from './calc-worker.js';
import { calcInputToAppError } from '../studies/calc-errors.js';

/** Workers kept at most (each is one CPU core busy while it works). */
export const MAX_CALC_WORKERS = 2;

const idle: Worker[] = [];
let live = 0;
let nextId = 1;
const waiting: Array<(worker: Worker) => void> = [];

function spawn(): Worker {
  const isTypeScript = import.meta.url.endsWith('.ts');
  const entry = new URL(isTypeScript ? './calc-worker.ts' : './calc-worker.js', import.meta.url);
  let worker: Worker;
  if (isTypeScript) {
    const loader = new URL('../../node_modules/tsx/dist/esm/api/index.mjs', import.meta.url).href;
    const bootstrap = `import(${JSON.stringify(loader)}).then((tsx) => { tsx.register(); return import(${JSON.stringify(entry.href)}); })`;
    worker = new Worker(bootstrap, { eval: true });
  } else {
    worker = new Worker(entry);
  }
  worker.unref();
  live += 1;
  return worker;
}

function acquire(): Promise<Worker> {
  const worker = idle.pop();
  if (worker) return Promise.resolve(worker);
  if (live < MAX_CALC_WORKERS) return Promise.resolve(spawn());
  return new Promise((resolve) => waiting.push(resolve));
}

function release(worker: Worker): void {
  const next = waiting.shift();
  if (next) next(worker);
  else idle.push(worker);
}

function discard(worker: Worker): void {
  live -= 1;
  void worker.terminate();
  // Someone waiting gets a fresh worker in its place.
  const next = waiting.shift();
  if (next) next(spawn());
}

/**
 * Runs a calc command in a worker thread.
 * @param command name in calc/commands.ts
 * @param input the command's JSON input
 * @param timeLimitMs wall-clock limit [ms]
 * @param what for the time-limit message ("The simulation")
 * @param fieldPrefix prefixed to a CalcInputError's field in the 400 answer
 * @throws AppError 400 naming the field for bad input, 413 over the time limit
 */
export async function runCalcInWorker<T>(command: string, input: unknown, timeLimitMs: number, what: string, fieldPrefix = ''): Promise<T> {
  const worker = await acquire();
  const id = nextId++;
  return new Promise<T>((resolve, reject) => {
    const finish = () => {
      clearTimeout(timer);
      worker.off('message', onMessage);
      worker.off('error', onError);
    };
    const onMessage = (response: CalcWorkerResponse) => {
      if (response.id !== id) return;
      finish();
      release(worker);
      if (response.ok) resolve(response.result as T);
      else if (response.field !== null) reject(calcInputToAppError(new CalcInputError(response.field, response.message.replace(/^"[^"]*" /, '')), fieldPrefix));
      else reject(new AppError('calc-failed', `${what} failed: ${response.message}`, 500));
    };
    const onError = (error: Error) => {
      finish();
      discard(worker);
      reject(error);
    };
    const timer = setTimeout(() => {
      finish();
      discard(worker);
      reject(tooLarge(`${what} took longer than ${Math.round(timeLimitMs / 1000)} s and was stopped; ask for less (a shorter duration, a longer step, fewer steps).`));
    }, timeLimitMs);
    worker.on('message', onMessage);
    worker.on('error', onError);
    worker.postMessage({ id, command, input } satisfies CalcWorkerRequest);
  });
}

/** Terminates the idle workers (at shutdown). */
export async function closeCalcWorkers(): Promise<void> {
  const workers = idle.splice(0);
  live -= workers.length;
  await Promise.all(workers.map((worker) => worker.terminate()));
}
