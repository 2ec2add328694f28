import type { Clock } from '../adapters/clock';
import type { Mailer } from '../adapters/mail/mailer';
import type { AppConfig } from '../config';
import type { Db } from '../db/database';
import type { Logger } from '../lib/logger';
import { createAuthService } from '../modules/auth/auth.service';
import { createBookingService } from '../modules/booking/booking.service';
import { createDaysService } from '../modules/days/days.service';
import { createInvitationsService } from '../modules/invitations/invitations.service';
import { runPendingJobs, startJobWorker } from './job-queue';

export interface JobDeps {
  db: Db;
  clock: Clock;
  mailer: Mailer;
  config: AppConfig;
  logger: Logger;
}

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
  return {
    handlers: { ...invitations.handlers(), ...booking.handlers() },
    queueDueDayBefore: () => invitations.queueDueDayBefore(),
  };
}

/** Runs the due jobs now (tests call this instead of waiting for the worker). */
export async function runDayJobsOnce(deps: JobDeps): Promise<number> {
  const jobs = createDayJobs(deps);
  await jobs.queueDueDayBefore();
  return runPendingJobs(deps.db, jobs.handlers, deps.logger);
}

/** The background worker the start script runs: polls every second until stopped. */
export function startDayJobsWorker(deps: JobDeps, intervalMs = 1000) {
  const jobs = createDayJobs(deps);
  let lastScan = 0;
  return startJobWorker({
    db: deps.db,
    handlers: jobs.handlers,
    logger: deps.logger,
    intervalMs,
    // Looking for day-before messages once a minute is plenty.
    tick: async () => {
      if (Date.now() - lastScan < 60_000) return;
      lastScan = Date.now();
      await jobs.queueDueDayBefore();
    },
  });
}
