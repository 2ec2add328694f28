import { sql, type Transaction } from 'kysely';
import type { Db } from '../db/database';
import type { Database } from '../db/types';
import type { Logger } from '../lib/logger';

/**
 * A small PostgreSQL-backed job queue. Jobs are rows, enqueued in the same transaction as the
 * change that causes them (so a rolled-back change leaves no job behind). Workers claim rows
 * with FOR UPDATE SKIP LOCKED, so several processes never take the same job; a claim lapses
 * after a lease, so a crashed worker's job is picked up again.
 */
/** `lastAttempt` tells a handler that a failure now is final (no retry follows). */
export type JobHandler = (payload: unknown, attempt: { lastAttempt: boolean }) => Promise<void>;
export type JobHandlers = Record<string, JobHandler>;

const leaseSeconds = 120;
const maxAttempts = 3;

export async function enqueueJobs(
  db: Db | Transaction<Database>,
  kind: string,
  payloads: unknown[],
): Promise<void> {
  if (payloads.length === 0) return;
  await db
    .insertInto('jobQueue')
    .values(payloads.map((payload) => ({ kind, payload: JSON.stringify(payload) })))
    .execute();
}

interface ClaimedJob {
  id: string;
  kind: string;
  payload: unknown;
  attempts: number;
}

async function claimJobs(db: Db, limit: number): Promise<ClaimedJob[]> {
  const result = await sql<ClaimedJob>`
    update job_queue set locked_until = now() + make_interval(secs => ${leaseSeconds}),
      attempts = attempts + 1
    where id in (
      select id from job_queue
      where done_at is null and run_at <= now()
        and (locked_until is null or locked_until < now())
      order by id
      limit ${limit}
      for update skip locked
    )
    returning id, kind, payload, attempts`.execute(db);
  return result.rows;
}

async function finishJob(db: Db, job: ClaimedJob, error: unknown): Promise<void> {
  if (!error) {
    await db
      .updateTable('jobQueue')
      .set({ doneAt: sql`now()` })
      .where('id', '=', job.id)
      .execute();
    return;
  }
  const giveUp = job.attempts >= maxAttempts;
  await db
    .updateTable('jobQueue')
    .set({
      lastError: String(error instanceof Error ? error.message : error).slice(0, 500),
      lockedUntil: null,
      // Back off: 30 s, then 2 min; after the last attempt the job is closed as done.
      runAt: sql`now() + make_interval(secs => ${30 * 4 ** (job.attempts - 1)})`,
      ...(giveUp ? { doneAt: sql`now()` } : {}),
    })
    .where('id', '=', job.id)
    .execute();
}

/** Runs every job that is due, batch by batch, until none is left; returns how many ran. */
export async function runPendingJobs(
  db: Db,
  handlers: JobHandlers,
  logger: Logger,
  batchSize = 20,
): Promise<number> {
  let ran = 0;
  for (;;) {
    const jobs = await claimJobs(db, batchSize);
    if (jobs.length === 0) return ran;
    for (const job of jobs) {
      const handler = handlers[job.kind];
      let failure: unknown = null;
      try {
        if (!handler) throw new Error(`No handler for job kind ${job.kind}`);
        await handler(job.payload, { lastAttempt: job.attempts >= maxAttempts });
      } catch (error) {
        failure = error ?? new Error('job failed');
        logger.warn({ err: error, jobId: job.id, kind: job.kind }, 'job failed');
      }
      await finishJob(db, job, failure);
      ran += 1;
    }
  }
}

/** Polls the queue in the background; `tick` runs before each poll (e.g. to schedule jobs). */
export function startJobWorker(options: {
  db: Db;
  handlers: JobHandlers;
  logger: Logger;
  intervalMs?: number;
  tick?: () => Promise<void>;
}): { stop(): Promise<void> } {
  let stopped = false;
  let running: Promise<void> | null = null;
  const poll = async () => {
    try {
      await options.tick?.();
      await runPendingJobs(options.db, options.handlers, options.logger);
    } catch (error) {
      options.logger.error({ err: error }, 'job worker poll failed');
    }
  };
  // One poll at a time: a slow batch delays the next poll instead of overlapping it.
  const timer = setInterval(() => {
    if (stopped || running) return;
    running = poll().finally(() => {
      running = null;
    });
  }, options.intervalMs ?? 1000);
  return {
    async stop() {
      stopped = true;
      clearInterval(timer);
      await running;
    },
  };
}
