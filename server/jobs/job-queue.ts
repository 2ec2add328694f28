import { Logger as WorkerLogger, type LogLevel, type Task, type TaskList } from 'graphile-worker';
import { sql, type Kysely, type RawBuilder, type Transaction } from 'kysely';
import type { Database } from '../db/types';
import type { Logger } from '../lib/logger';

/**
 * Background jobs run on graphile-worker. A job is added with graphile_worker.add_job in the
 * same transaction as the change that causes it, so a rolled-back change leaves no job behind;
 * the worker takes each job once (SKIP LOCKED) and retries a failure with exponential back-off.
 */

/** `lastAttempt` tells a handler that a failure now is final (no retry follows). */
export type JobHandler = (payload: unknown, attempt: { lastAttempt: boolean }) => Promise<void>;
export type JobHandlers = Record<string, JobHandler>;

export interface AddJobOptions {
  /** A second job with the same key, while the first still waits, replaces it (one run). */
  jobKey?: string;
  /** 'preserve_run_at': a burst of adds keeps the first one's time, so the job is not starved. */
  jobKeyMode?: 'replace' | 'preserve_run_at';
  maxAttempts?: number;
  runAt?: Date;
}

// Mail that has failed three times is better reported as failed than retried for hours.
export const DEFAULT_MAX_ATTEMPTS = 3;

type Executor = Kysely<Database> | Transaction<Database>;

/** Adds one job; pass the transaction that makes the change the job follows from. */
export async function addJob(
  db: Executor,
  taskName: string,
  payload: unknown,
  options: AddJobOptions = {},
): Promise<void> {
  await addJobs(db, taskName, [{ payload, ...options }]);
}

/** Adds several jobs of one task in a single statement (one round trip for a whole mailing). */
export async function addJobs(
  db: Executor,
  taskName: string,
  jobs: Array<{ payload: unknown } & AddJobOptions>,
): Promise<void> {
  if (jobs.length === 0) return;
  const specs = jobs.map((job) => ({
    payload: job.payload ?? null,
    jobKey: job.jobKey ?? null,
    jobKeyMode: job.jobKeyMode ?? 'replace',
    maxAttempts: job.maxAttempts ?? DEFAULT_MAX_ATTEMPTS,
    runAt: job.runAt?.toISOString() ?? null,
  }));
  const field = (name: string) => sql`(job ->> ${sql.lit(name)})`;
  await sql`
    select (${addJobExpression(taskName, {
      payload: sql`job -> 'payload'`,
      runAt: sql`${field('runAt')}::timestamptz`,
      maxAttempts: sql`${field('maxAttempts')}::int`,
      jobKey: field('jobKey'),
      jobKeyMode: field('jobKeyMode'),
    })}).id
    from json_array_elements(${JSON.stringify(specs)}::json) as job`.execute(db);
}

/**
 * graphile_worker.add_job as an SQL expression, for a statement that queues the job its own
 * change causes in the same round trip (a booking's confirmation); addJobs builds on it too.
 * Each term is an SQL expression; a term left out takes the same default as addJob.
 */
export function addJobExpression(
  taskName: string,
  terms: {
    payload: RawBuilder<unknown>;
    runAt?: RawBuilder<unknown>;
    maxAttempts?: RawBuilder<unknown>;
    jobKey?: RawBuilder<unknown>;
    jobKeyMode?: RawBuilder<unknown>;
  },
) {
  return sql<{ id: string }>`graphile_worker.add_job(
    ${taskName}::text,
    ${terms.payload},
    run_at => ${terms.runAt ?? sql`null::timestamptz`},
    max_attempts => ${terms.maxAttempts ?? sql`${DEFAULT_MAX_ATTEMPTS}::int`},
    job_key => ${terms.jobKey ?? sql`null::text`},
    job_key_mode => ${terms.jobKeyMode ?? sql`'replace'`}
  )`;
}

/** Turns our handlers into graphile-worker tasks, telling each attempt whether it is the last. */
export function toTaskList(handlers: JobHandlers): TaskList {
  const tasks: TaskList = {};
  for (const [name, handler] of Object.entries(handlers)) {
    const task: Task = async (payload, helpers) => {
      // graphile-worker counts the running attempt before calling the task.
      await handler(payload, { lastAttempt: helpers.job.attempts >= helpers.job.max_attempts });
    };
    tasks[name] = task;
  }
  return tasks;
}

// graphile-worker reports every finished job at "info": that is a debug detail here.
const pinoLevels: Record<string, 'error' | 'warn' | 'info' | 'debug'> = {
  error: 'error',
  warning: 'warn',
  info: 'debug',
  debug: 'debug',
};

/** graphile-worker's log lines go to the app's logger (and so are silent in tests). */
export function workerLogger(logger: Logger): WorkerLogger {
  return new WorkerLogger((scope) => (level: LogLevel, message: string, meta?: object) => {
    logger[pinoLevels[String(level)] ?? 'info']({ ...scope, ...meta }, message);
  });
}
