/**
 * Message protocol of the simulation worker, free of any environment: the edge (worker.ts) hands
 * each incoming message to `handle` and posts what `post` receives.
 *
 *   in:  {type: 'start', input}  — input as the `simulate` command takes it
 *        {type: 'cancel'}
 *   out: {type: 'progress', fraction}            — 0 to 1, after each chunk
 *        {type: 'result', result}                — the `simulate` command's JSON output
 *        {type: 'error', message, field}         — field: the offending input (CalcInputError) or null
 *        {type: 'cancelled'}                     — after a cancel
 * The run advances in chunks and yields to the event loop between them, so a cancel is seen.
 */
import { CalcInputError } from '../errors.js';
import { simulationResultToJson, startSimulationFromJson, type SimulateOutput } from './commands.js';
import { DEFAULT_CHUNK_STEPS } from './progress.js';

export type WorkerRequest = { type: 'start'; input: unknown } | { type: 'cancel' };
export type WorkerResponse =
  | { type: 'progress'; fraction: number }
  | { type: 'result'; result: SimulateOutput }
  | { type: 'error'; message: string; field: string | null }
  | { type: 'cancelled' };

/**
 * Creates the message handler of one worker.
 * @param post sends a response to the caller
 * @param yieldToEventLoop resolves after pending messages were delivered (setTimeout 0 in both environments)
 * @param chunkSteps grid steps between progress messages [-]
 */
export function createWorkerHandler(
  post: (message: WorkerResponse) => void,
  yieldToEventLoop: () => Promise<void> = () => new Promise((resolve) => setTimeout(resolve, 0)),
  chunkSteps = DEFAULT_CHUNK_STEPS,
): (message: WorkerRequest) => Promise<void> {
  let cancelled = false;
  let running = false;
  return async (message: WorkerRequest): Promise<void> => {
    if (message.type === 'cancel') {
      cancelled = true;
      return;
    }
    if (message.type !== 'start') return;
    if (running) {
      post({ type: 'error', message: 'a simulation is already running in this worker', field: null });
      return;
    }
    running = true;
    cancelled = false;
    try {
      const run = startSimulationFromJson(message.input);
      while (!run.done) {
        await yieldToEventLoop();
        if (cancelled) {
          post({ type: 'cancelled' });
          return;
        }
        post({ type: 'progress', fraction: run.advance(chunkSteps) });
      }
      post({ type: 'result', result: simulationResultToJson(run.result()) });
    } catch (error) {
      if (error instanceof CalcInputError) post({ type: 'error', message: error.message, field: error.field });
      else post({ type: 'error', message: error instanceof Error ? error.message : String(error), field: null });
    } finally {
      running = false;
    }
  };
}
