/**
 * Background jobs on a PostgreSQL table (`jobs`), so that several app instances can share the work
 * against one database:
 *
 * - enqueue: a row with status `queued` (in the caller's transaction), then a local wake-up;
 * - claim: `UPDATE … WHERE id = (SELECT id … WHERE status = 'queued' ORDER BY id FOR UPDATE SKIP
 *   LOCKED LIMIT 1)`: each queued job goes to exactly one runner, and runners never wait on each other;
 * - run: in this process, off the request; the handler reports progress, which also writes a
 *   heartbeat, yields to the event loop and notices a cancel (the job's status no longer `running`);
 * - recover: a job left `running` whose heartbeat is older than `staleAfterMs` (its process died)
 *   goes back to `queued` — at start and at every poll — and is run again from the beginning, up to
 *   MAX_ATTEMPTS attempts (then `failed`), so a job that kills its process cannot loop forever.
 *   On a clean stop a runner puts its own running jobs back to `queued` at once.
 *
 * Handlers must therefore be idempotent (a screening is: it only reads and then writes its result).
 */
import { hostname } from 'node:os';
import { randomBytes } from 'node:crypto';
import { QueryTypes, type Transaction } from 'sequelize';
import { AppError } from '../lib/errors.js';
import { database } from '../lib/database.js';
import { logger } from '../lib/logger.js';
import { Job } from '../models/index.js';

/** Attempts of one job before a stale one is failed instead of re-queued. */
export const MAX_ATTEMPTS = 3;
/** A running job whose heartbeat is older than this belongs to a dead process [ms]. */
export const DEFAULT_STALE_AFTER_MS = 60_000;
/** Polling period for jobs enqueued by other instances [ms]. */
export const DEFAULT_POLL_MS = 2_000;

export interface JobContext {
  job: Job;
  /**
   * Records progress (0–1) and the heartbeat, yields to the event loop, and throws JobStopped when
   * the job was cancelled or the runner is stopping. Call it every few units of work.
   */
  progress(fraction: number): Promise<void>;
}

export type JobHandler = (context: JobContext) => Promise<unknown>;

/** Thrown inside a handler (by `progress`) when the job must stop. */
export class JobStopped extends Error {
  constructor(readonly reason: 'cancelled' | 'shutdown') {
    super(`job stopped: ${reason}`);
  }
}

const handlers = new Map<string, JobHandler>();

/** Registers the handler of one kind of job. */
export function registerJobKind(kind: string, handler: JobHandler): void {
  handlers.set(kind, handler);
}

export interface JobRunnerOptions {
  pollMs?: number;
  staleAfterMs?: number;
  /** Jobs this instance runs at the same time. */
  concurrency?: number;
}

export class JobRunner {
  readonly id = `${hostname()}:${process.pid}:${randomBytes(3).toString('hex')}`;
  private readonly pollMs: number;
  private readonly staleAfterMs: number;
  private readonly concurrency: number;
  private timer: NodeJS.Timeout | undefined;
  private polling = false;
  private pollAgain = false;
  private stopping = false;
  private readonly active = new Set<Promise<void>>();

  constructor(options: JobRunnerOptions = {}) {
    this.pollMs = options.pollMs ?? DEFAULT_POLL_MS;
    this.staleAfterMs = options.staleAfterMs ?? DEFAULT_STALE_AFTER_MS;
    this.concurrency = options.concurrency ?? 1;
  }

  async start(): Promise<void> {
    await this.recoverStale();
    this.timer = setInterval(() => this.wake(), this.pollMs);
    this.timer.unref();
    this.wake();
  }

  /** Looks for queued work now (after an enqueue in this process). */
  wake(): void {
    if (this.stopping) return;
    if (this.polling) {
      this.pollAgain = true;
      return;
    }
    this.polling = true;
    void this.poll()
      .catch((error: unknown) => logger.warn('job poll failed', { error: error instanceof Error ? error.message : String(error) }))
      .finally(() => {
        this.polling = false;
        if (this.pollAgain) {
          this.pollAgain = false;
          this.wake();
        }
      });
  }

  /** Stops claiming, lets running handlers stop at their next progress call, re-queues their jobs. */
  async stop(): Promise<void> {
    this.stopping = true;
    if (this.timer) clearInterval(this.timer);
    await Promise.allSettled([...this.active]);
  }

  /** Re-queues (or fails, after MAX_ATTEMPTS) running jobs whose heartbeat is stale. */
  async recoverStale(): Promise<number> {
    const rows = await database().query<{ id: number }>(
      `UPDATE jobs SET
         status = CASE WHEN attempts >= :maxAttempts THEN 'failed'::enum_jobs_status ELSE 'queued'::enum_jobs_status END,
         error = CASE WHEN attempts >= :maxAttempts THEN 'The job stopped with its process ' || attempts || ' times; it was given up.' ELSE error END,
         finished_at = CASE WHEN attempts >= :maxAttempts THEN now() ELSE NULL END,
         locked_by = NULL, updated_at = now()
       WHERE status = 'running' AND (heartbeat_at IS NULL OR heartbeat_at < now() - make_interval(secs => :staleSeconds))
       RETURNING id`,
      { replacements: { maxAttempts: MAX_ATTEMPTS, staleSeconds: this.staleAfterMs / 1000 }, type: QueryTypes.SELECT },
    );
    if (rows.length > 0) logger.info(`re-queued ${rows.length} job(s) left running by a stopped process`);
    return rows.length;
  }

  private async poll(): Promise<void> {
    await this.recoverStale();
    while (!this.stopping && this.active.size < this.concurrency) {
      const job = await this.claim();
      if (!job) return;
      const run = this.run(job).finally(() => {
        this.active.delete(run);
        this.wake();
      });
      this.active.add(run);
    }
  }

  private async claim(): Promise<Job | null> {
    const kinds = [...handlers.keys()];
    if (kinds.length === 0) return null;
    const rows = await database().query<{ id: number }>(
      `UPDATE jobs SET status = 'running', locked_by = :runner, heartbeat_at = now(), started_at = COALESCE(started_at, now()),
         attempts = attempts + 1, updated_at = now()
       WHERE id = (SELECT id FROM jobs WHERE status = 'queued' AND kind IN (:kinds) ORDER BY id FOR UPDATE SKIP LOCKED LIMIT 1)
       RETURNING id`,
      { replacements: { runner: this.id, kinds }, type: QueryTypes.SELECT },
    );
    const id = rows[0]?.id;
    return id === undefined ? null : Job.findByPk(id);
  }

  private async run(job: Job): Promise<void> {
    const handler = handlers.get(job.kind)!;
    let lastBeat = 0;
    const context: JobContext = {
      job,
      progress: async (fraction: number) => {
        await new Promise((resolve) => setImmediate(resolve));
        if (this.stopping) throw new JobStopped('shutdown');
        const now = Date.now();
        // Progress writes are cheap but not free: at most a few a second.
        if (now - lastBeat < 200 && fraction < 1) return;
        lastBeat = now;
        const [affected] = await Job.update(
          { progress: Math.max(0, Math.min(1, fraction)), heartbeatAt: new Date() },
          { where: { id: job.id, lockedBy: this.id, status: 'running' } },
        );
        if (affected === 0) throw new JobStopped('cancelled');
      },
    };
    try {
      const result = await handler(context);
      await Job.update(
        { status: 'done', progress: 1, result: (result ?? null) as Job['result'], finishedAt: new Date(), lockedBy: null },
        { where: { id: job.id, lockedBy: this.id, status: 'running' } },
      );
    } catch (error) {
      if (error instanceof JobStopped) {
        if (error.reason === 'shutdown') {
          await Job.update({ status: 'queued', lockedBy: null }, { where: { id: job.id, lockedBy: this.id, status: 'running' } });
        }
        return;
      }
      const message = error instanceof AppError ? error.message : 'The job failed on the server; the error has been logged.';
      if (!(error instanceof AppError)) logger.error('job failed', { id: job.id, kind: job.kind, error: error instanceof Error ? (error.stack ?? error.message) : String(error) });
      await Job.update(
        { status: 'failed', error: message, finishedAt: new Date(), lockedBy: null },
        { where: { id: job.id, lockedBy: this.id, status: 'running' } },
      );
    }
  }
}

let current: JobRunner | undefined;

/** Starts this process's runner (once). */
export async function startJobRunner(options: JobRunnerOptions = {}): Promise<JobRunner> {
  if (current) await current.stop();
  current = new JobRunner(options);
  await current.start();
  return current;
}

export async function stopJobRunner(): Promise<void> {
  const runner = current;
  current = undefined;
  await runner?.stop();
}

/** Queues a job; the local runner is woken once the caller's transaction has committed. */
export async function enqueueJob(
  values: { organizationId: number; kind: string; params: Record<string, unknown>; createdBy: number | null },
  transaction?: Transaction,
): Promise<Job> {
  const job = await Job.create(values, transaction ? { transaction } : {});
  if (transaction) transaction.afterCommit(() => current?.wake());
  else current?.wake();
  return job;
}
