/**
 * Progress and cancellation of a long simulation, so that a worker thread (server) or a Web Worker
 * (browser) can report how far it is and stop when asked. Pure: the callbacks are the caller's.
 */

/** Steps run between two progress reports and cancel checks when the caller does not say. */
export const DEFAULT_CHUNK_STEPS = 20_000;

/** Callbacks of a run. */
export interface ProgressOptions {
  /** Called after each chunk with the fraction done [-], 0 to 1. */
  onProgress?: (fraction: number) => void;
  /** Called after each chunk; returning true stops the run with SimulationCancelledError. */
  shouldCancel?: () => boolean;
  /** Steps per chunk [-]; default DEFAULT_CHUNK_STEPS. */
  chunkSteps?: number;
}

/** Thrown when shouldCancel answers true: not an input error, the caller asked to stop. */
export class SimulationCancelledError extends Error {
  constructor() {
    super('the simulation was cancelled');
    this.name = 'SimulationCancelledError';
  }
}

/** Anything that advances in chunks: the simulation run. */
export interface SteppedRun<Result> {
  /** Runs up to `maxSteps` more steps; returns the fraction done [-]. */
  advance(maxSteps: number): number;
  readonly done: boolean;
  /** The result once done; throws before. */
  result(): Result;
}

/**
 * Runs a stepped computation to the end in chunks, reporting progress and honouring cancel.
 * @param run the computation
 * @param options callbacks and chunk size
 * @returns the run's result
 */
export function runToEnd<Result>(run: SteppedRun<Result>, options: ProgressOptions = {}): Result {
  const chunk = Math.max(1, Math.floor(options.chunkSteps ?? DEFAULT_CHUNK_STEPS));
  while (!run.done) {
    if (options.shouldCancel?.() === true) throw new SimulationCancelledError();
    const fraction = run.advance(chunk);
    options.onProgress?.(fraction);
  }
  return run.result();
}
