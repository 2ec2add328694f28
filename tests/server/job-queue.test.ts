import { mailIdentity } from '../../server/config';
import { makeWorkerUtils } from 'graphile-worker';
import { sql } from 'kysely';
import { afterAll, beforeAll, beforeEach, describe, expect, it } from 'vitest';
import { createSmtpMailer } from '../../server/adapters/mail/mailer';
import { runDayJobsOnce } from '../../server/jobs/day-jobs';
import { addJob, addJobs, type JobHandlers } from '../../server/jobs/job-queue';
import { createLogger } from '../../server/lib/logger';
import { startTestApp, type TestApp } from '../setup/test-app';

let t: TestApp;
let mailer: ReturnType<typeof createSmtpMailer>;
let seen: Array<{ task: string; payload: unknown; lastAttempt: boolean }>;

const probeTasks: JobHandlers = {
  probe: async (payload, attempt) => {
    seen.push({ task: 'probe', payload, lastAttempt: attempt.lastAttempt });
  },
  flaky: async (payload, attempt) => {
    seen.push({ task: 'flaky', payload, lastAttempt: attempt.lastAttempt });
    throw new Error('the mail server said no');
  },
};

// The same entry point the day jobs use, with the probes added the way a new task is added.
const runJobs = () =>
  runDayJobsOnce(
    {
      db: t.db,
      databaseUrl: t.database.url,
      clock: t.clock,
      mailer,
      config: t.config,
      logger: createLogger('silent'),
    },
    probeTasks,
  );

async function waitingJobs(task: string) {
  const result = await sql<{ id: string; attempts: number; lastError: string | null }>`
    select id, attempts, last_error from graphile_worker.jobs where task_identifier = ${task}
    order by id`.execute(t.db);
  return result.rows;
}

beforeAll(async () => {
  t = await startTestApp();
  mailer = createSmtpMailer({ smtpUrl: t.mail.smtpUrl, ...mailIdentity(t.config) });
});
afterAll(async () => {
  mailer.close();
  await t.close();
});
beforeEach(async () => {
  seen = [];
  // Each test starts from an empty queue, whatever the one before it left behind.
  await sql`delete from graphile_worker._private_jobs`.execute(t.db);
});

describe('background jobs on graphile-worker', () => {
  it('runs a job only if the transaction that added it commits', async () => {
    await expect(
      t.db.transaction().execute(async (trx) => {
        await addJob(trx, 'probe', { from: 'rolled back' });
        throw new Error('the change failed');
      }),
    ).rejects.toThrow('the change failed');
    await t.db.transaction().execute(async (trx) => {
      await addJob(trx, 'probe', { from: 'committed' });
    });

    expect(await runJobs()).toBe(1);
    expect(seen).toEqual([{ task: 'probe', payload: { from: 'committed' }, lastAttempt: false }]);
    expect(await waitingJobs('probe')).toEqual([]); // done jobs leave the queue
  });

  it('keeps one job per job key while it waits, and batches distinct jobs', async () => {
    await addJob(t.db, 'probe', { version: 1 }, { jobKey: 'probe:one' });
    await addJob(t.db, 'probe', { version: 2 }, { jobKey: 'probe:one' });
    await addJobs(t.db, 'probe', [{ payload: { batch: 'a' } }, { payload: { batch: 'b' } }]);
    expect(await waitingJobs('probe')).toHaveLength(3);

    expect(await runJobs()).toBe(3);
    expect(seen.map((entry) => entry.payload)).toEqual(
      expect.arrayContaining([{ version: 2 }, { batch: 'a' }, { batch: 'b' }]),
    );
    expect(seen).toHaveLength(3);
  });

  it('does not run a job before its time', async () => {
    await addJob(t.db, 'probe', { later: true }, { runAt: new Date(Date.now() + 3_600_000) });
    expect(await runJobs()).toBe(0);
    expect(await waitingJobs('probe')).toHaveLength(1);
  });

  it('retries a failed job and tells its last attempt that it is the last', async () => {
    await addJob(t.db, 'flaky', { mailingId: 'm-1' }, { maxAttempts: 2 });
    const utils = await makeWorkerUtils({ connectionString: t.database.url });
    // A retry waits with back-off; bring it forward instead of sleeping.
    const bringForward = async () => {
      const ids = (await waitingJobs('flaky')).map((job) => job.id);
      await utils.rescheduleJobs(ids, { runAt: new Date() });
    };
    try {
      expect(await runJobs()).toBe(1);
      expect(seen.map((entry) => entry.lastAttempt)).toEqual([false]);
      expect(await runJobs()).toBe(0); // the retry is not due yet

      await bringForward();
      expect(await runJobs()).toBe(1);
      expect(seen.map((entry) => entry.lastAttempt)).toEqual([false, true]);

      // Given up: it stays for inspection with its reason, and never runs again.
      await bringForward();
      expect(await runJobs()).toBe(0);
      expect(await waitingJobs('flaky')).toEqual([
        expect.objectContaining({ attempts: 2, lastError: 'the mail server said no' }),
      ]);
    } finally {
      await utils.release();
    }
  });
});
