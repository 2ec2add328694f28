import { sql, type Transaction } from 'kysely';
import type { Db } from '../../db/database';
import type { Database } from '../../db/types';

type Executor = Db | Transaction<Database>;

export async function findLook(db: Executor, clientId: string) {
  return db
    .selectFrom('clientLooks')
    .where('clientId', '=', clientId)
    .selectAll()
    .executeTakeFirst();
}

/** Saves a client's look; every save is a new version, so older renditions are known stale. */
export async function saveLook(
  db: Executor,
  clientId: string,
  look: { name: string; renditions: unknown[]; fileNameTemplate: string },
  userId: string,
) {
  return db
    .insertInto('clientLooks')
    .values({
      clientId,
      name: look.name,
      renditions: JSON.stringify(look.renditions),
      fileNameTemplate: look.fileNameTemplate,
      updatedByUserId: userId,
    })
    .onConflict((conflict) =>
      conflict.column('clientId').doUpdateSet({
        name: look.name,
        renditions: JSON.stringify(look.renditions),
        fileNameTemplate: look.fileNameTemplate,
        updatedByUserId: userId,
        version: sql`client_looks.version + 1`,
        updatedAt: sql`now()`,
      }),
    )
    .returningAll()
    .executeTakeFirstOrThrow();
}
