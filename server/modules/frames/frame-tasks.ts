import { z } from 'zod';
import type { ObjectStorage } from '../../adapters/storage/storage';
import type { Db } from '../../db/database';
import type { JobHandlers } from '../../jobs/job-queue';
import type { Logger } from '../../lib/logger';
import { createFrameIngest } from './frame-ingest';
import { INGEST_FRAME_TASK } from './frames.service';

const ingestPayloadSchema = z.object({ frameId: z.uuid() });

/** The frames' background tasks, for the job worker's task list. */
export function frameTasks(deps: {
  db: Db;
  storage: ObjectStorage;
  maxPixels: number;
  logger: Logger;
}): JobHandlers {
  const ingest = createFrameIngest(deps);
  return {
    [INGEST_FRAME_TASK]: (payload, attempt) =>
      ingest(ingestPayloadSchema.parse(payload).frameId, attempt),
  };
}
