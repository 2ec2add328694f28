import type { Db } from '../db/database';

/** Audit entries name what happened and to which record, never personal data. */
export async function recordAudit(
  db: Db,
  entry: {
    actorUserId: string | null;
    action: string;
    subjectType: string;
    subjectId: string | null;
    details?: Record<string, unknown>;
  },
): Promise<void> {
  await db
    .insertInto('auditEvents')
    .values({ ...entry, details: JSON.stringify(entry.details ?? {}) })
    .execute();
}
