import { mailIdentity } from '../../server/config';
import { createSmtpMailer } from '../../server/adapters/mail/mailer';
import { runDayJobsOnce } from '../../server/jobs/day-jobs';
import { createLogger } from '../../server/lib/logger';
import { frameTasks } from '../../server/modules/frames/frame-tasks';
import { matchingTasks } from '../../server/modules/matching/matching-tasks';
import { portraitTasks } from '../../server/modules/looks/portrait-tasks';
import { createDeliveryService } from '../../server/modules/delivery/delivery.service';
import type { Logger } from '../../server/lib/logger';
import type { TestApp } from '../setup/test-app';

function portraitsOf(t: TestApp, logger: Logger) {
  let tasks = portraitsByApp.get(t);
  if (!tasks) {
    tasks = portraitTasks({
      db: t.db,
      storage: t.storage,
      logger,
      studioName: t.config.studioName,
    });
    portraitsByApp.set(t, tasks);
  }
  return tasks;
}

/** Runs the queued jobs (booking mail, invitations, frame reading) now, as the worker would, into the catcher. */
// One set of portrait tasks per test app: the eye model loads once, on the first detection.
const portraitsByApp = new WeakMap<TestApp, ReturnType<typeof portraitTasks>>();

export async function runQueuedJobs(t: TestApp): Promise<number> {
  const mailer = createSmtpMailer({ smtpUrl: t.mail.smtpUrl, ...mailIdentity(t.config) });
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
        ...portraitsOf(t, logger).handlers,
        ...createDeliveryService({ db: t.db, clock: t.clock, storage: t.storage }).handlers(),
      },
    );
  } finally {
    mailer.close();
  }
}
