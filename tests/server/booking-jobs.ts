import { createSmtpMailer } from '../../server/adapters/mail/mailer';
import { runDayJobsOnce } from '../../server/jobs/day-jobs';
import { createLogger } from '../../server/lib/logger';
import type { TestApp } from '../setup/test-app';

/** Runs the queued jobs (booking mail, invitations) now, as the worker would, into the catcher. */
export async function runQueuedJobs(t: TestApp): Promise<number> {
  const mailer = createSmtpMailer({ smtpUrl: t.mail.smtpUrl, from: t.config.mailFrom });
  try {
    return await runDayJobsOnce({
      db: t.db,
      clock: t.clock,
      mailer,
      config: t.config,
      logger: createLogger('silent'),
    });
  } finally {
    mailer.close();
  }
}
