import type { ObjectStorage } from '../../adapters/storage/storage';
import type { Db } from '../../db/database';
import type { JobHandlers } from '../../jobs/job-queue';
import type { Logger } from '../../lib/logger';
import { createEyeFinder, type EyeFinder } from './eye-finder';
import { createPortraitsService } from './portraits.service';

/** The portrait jobs for the worker; the eye finder's model loads on the first detection. */
export function portraitTasks(deps: {
  db: Db;
  storage: ObjectStorage;
  logger: Logger;
  studioName: string;
}): { handlers: JobHandlers; close(): Promise<void> } {
  let finder: EyeFinder | null = null;
  const service = createPortraitsService({
    ...deps,
    eyeFinder: () => (finder ??= createEyeFinder()),
  });
  return {
    handlers: service.handlers(),
    close: async () => {
      await finder?.close();
    },
  };
}
