import type { Kysely } from 'kysely';

/**
 * Whether each previewed person is to be active, from the file's status column (null when the
 * file has none or leaves it blank: then being in the file means active, as before). Commit
 * writes it, so a leaver in the file is not made active again.
 */
export async function up(db: Kysely<any>): Promise<void> {
  await db.schema.alterTable('roster_import_rows').addColumn('active', 'boolean').execute();
}

export async function down(db: Kysely<any>): Promise<void> {
  await db.schema.alterTable('roster_import_rows').dropColumn('active').execute();
}
