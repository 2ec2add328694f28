import { createSmtpMailer } from '../../server/adapters/mail/mailer';
import { runDayJobsOnce } from '../../server/jobs/day-jobs';
import { createLogger } from '../../server/lib/logger';
import { frameTasks } from '../../server/modules/frames/frame-tasks';
import { matchingTasks } from '../../server/modules/matching/matching-tasks';
import type { TestApp } from '../setup/test-app';

/** Runs the queued jobs (booking mail, invitations, frame reading) now, as the worker would, into the catcher. */
export async function runQueuedJobs(t: TestApp): Promise<number> {
  const mailer = createSmtpMailer({ smtpUrl: t.mail.smtpUrl, from: t.config.mailFrom });
  try {
    const logger = createLogger('silent');
    return await runDayJobsOnce(
      {
        db: t.db,
        databaseUrl: t.database.url,
        clock: t.clock,
        mailer,
        config: t.config,
        logger,
      },
      {
        ...frameTasks({ db: t.db, storage: t.storage, maxPixels: 100_000_000, logger }),
        ...matchingTasks({ db: t.db, logger }),
      },
    );
  } finally {
    mailer.close();
  }
}
