import { z } from 'zod';
import type { Transaction } from 'kysely';
import type { Db } from '../../db/database';
import type { Database } from '../../db/types';
import { addJob, type JobHandlers } from '../../jobs/job-queue';
import type { Logger } from '../../lib/logger';
import type { MatchCause } from '../../db/match-types';
import { createMatchRunner, MATCH_DAY_TASK } from './matching-run';

const matchPayloadSchema = z.object({
  dayId: z.uuid(),
  cause: z.enum(['frames', 'sittings', 'on_demand']).default('frames'),
  userId: z.uuid().nullish(),
});

/**
 * Queues one match of a day. Every cause shares one job key, so many frames finishing at once
 * (or a sitting change during an upload) fold into a single run after them.
 */
export async function queueDayMatch(
  trx: Db | Transaction<Database>,
  dayId: string,
  cause: MatchCause,
  userId: string | null = null,
) {
  await addJob(
    trx,
    MATCH_DAY_TASK,
    { dayId, cause, userId },
    { jobKey: `match:${dayId}`, jobKeyMode: 'preserve_run_at' },
  );
}

/** The matching task, for the job worker's task list. */
export function matchingTasks(deps: { db: Db; logger: Logger }): JobHandlers {
  const runDayMatch = createMatchRunner(deps);
  return {
    [MATCH_DAY_TASK]: async (payload) => {
      const job = matchPayloadSchema.parse(payload);
      await runDayMatch(job.dayId, job.cause, job.userId ?? null);
    },
  };
}
