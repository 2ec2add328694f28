import { parseCronItems, run, runOnce, type TaskList } from 'graphile-worker';
import type { Clock } from '../adapters/clock';
import type { Mailer } from '../adapters/mail/mailer';
import type { AppConfig } from '../config';
import type { Db } from '../db/database';
import type { Logger } from '../lib/logger';
import { createAuthService } from '../modules/auth/auth.service';
import { createBookingService } from '../modules/booking/booking.service';
import { createDaysService } from '../modules/days/days.service';
import { createInvitationsService } from '../modules/invitations/invitations.service';
import { portraitsMailTasks } from '../modules/delivery/delivery-mail';
import { proofsServiceFor } from '../modules/proofs/proofs-wiring';
import { toTaskList, workerLogger, type JobHandlers } from './job-queue';

export interface JobDeps {
  db: Db;
  /** graphile-worker opens its own connections (it LISTENs for new jobs). */
  databaseUrl: string;
  clock: Clock;
  mailer: Mailer;
  config: AppConfig;
  logger: Logger;
}

/** Looks for days starting soon whose booked sitters still need their day-before message. */
export const DAY_BEFORE_SCAN_TASK = 'day-before-scan';

/** The services the background jobs need, wired the same way createApp wires them. */
export function createDayJobs(deps: JobDeps) {
  const auth = createAuthService(deps);
  const days = createDaysService({ db: deps.db });
  const booking = createBookingService(deps);
  const invitations = createInvitationsService({
    ...deps,
    days,
    booking,
    issueSitterInvitationLink: (personId) => auth.issueSitterInvitationLink(personId),
  });
  const proofs = proofsServiceFor({ ...deps, auth });
  return {
    handlers: {
      ...auth.handlers(),
      ...invitations.handlers(),
      ...booking.handlers(),
      ...proofs.handlers(),
      ...portraitsMailTasks({ ...deps, publicUrl: deps.config.publicUrl }),
    },
    queueDueDayBefore: () => invitations.queueDueDayBefore(),
  };
}

function allHandlers(deps: JobDeps, extraTasks: JobHandlers): JobHandlers {
  const jobs = createDayJobs(deps);
  return {
    ...jobs.handlers,
    [DAY_BEFORE_SCAN_TASK]: async () => {
      await jobs.queueDueDayBefore();
    },
    ...extraTasks,
  };
}

/**
 * Every task the worker knows, by name. A new task is one more entry in `extraTasks`
 * (e.g. `{ [INGEST_FRAME_TASK]: (payload, attempt) => frames.ingest(payload, attempt) }`).
 */
export function createTaskList(deps: JobDeps, extraTasks: JobHandlers = {}): TaskList {
  return toTaskList(allHandlers(deps, extraTasks));
}

/**
 * Runs the due jobs now and returns how many ran (tests call this instead of waiting for the
 * worker). The day-before scan runs first, so the messages it queues go out in the same call.
 */
export async function runDayJobsOnce(deps: JobDeps, extraTasks: JobHandlers = {}): Promise<number> {
  await createDayJobs(deps).queueDueDayBefore();
  let ran = 0;
  const counted: JobHandlers = {};
  for (const [name, handler] of Object.entries(allHandlers(deps, extraTasks))) {
    counted[name] = (payload, attempt) => {
      ran += 1;
      return handler(payload, attempt);
    };
  }
  await runOnce({
    connectionString: deps.databaseUrl,
    taskList: toTaskList(counted),
    concurrency: 1,
    noHandleSignals: true,
    logger: workerLogger(deps.logger),
  });
  return ran;
}

/** The background worker the start script runs, with the day-before scan once a minute. */
export async function startDayJobsWorker(
  deps: JobDeps,
  extraTasks: JobHandlers = {},
  options: { preparedStatements?: boolean } = {},
): Promise<{ stop(): Promise<void> }> {
  const runner = await run({
    connectionString: deps.databaseUrl,
    taskList: createTaskList(deps, extraTasks),
    // Once a minute is plenty for day-before messages; a scan missed while stopped is not
    // worth catching up (the next one finds the same days), and a failed scan is not retried.
    parsedCronItems: parseCronItems([
      {
        task: DAY_BEFORE_SCAN_TASK,
        match: '* * * * *',
        options: { backfillPeriod: 0, maxAttempts: 1 },
      },
    ]),
    concurrency: 2,
    // New jobs arrive by LISTEN/NOTIFY at once; polling only finds retries that came due.
    pollInterval: 2000,
    noHandleSignals: true,
    // graphile-worker prepares its statements too; the same setting turns that off (README).
    noPreparedStatements: options.preparedStatements === false,
    logger: workerLogger(deps.logger),
  });
  return {
    async stop() {
      await runner.stop();
    },
  };
}
