/** The job kinds of Statorline, registered with the runner; `startJobs` is called by the start command and the tests. */
import { closeCalcWorkers } from '../designs/worker-pool.js';
import { runScreening } from '../screening/job.js';
import { registerJobKind, startJobRunner, stopJobRunner, type JobRunner, type JobRunnerOptions } from './runner.js';

registerJobKind('screening', runScreening);

export function startJobs(options: JobRunnerOptions = {}): Promise<JobRunner> {
  return startJobRunner(options);
}

/** Stops the runner (its running jobs go back to the queue) and the calc worker threads. */
export async function stopJobs(): Promise<void> {
  await stopJobRunner();
  await closeCalcWorkers();
}
