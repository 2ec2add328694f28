import type { Kysely } from 'kysely';

/**
 * The file's own row of each data row, kept when blank lines made it differ from "position
 * plus one for the header" (null otherwise): the preview and the rows to fix name the row a
 * spreadsheet shows, and a remap recomputes them from this.
 */
export async function up(db: Kysely<any>): Promise<void> {
  await db.schema.alterTable('roster_import_drafts').addColumn('row_numbers', 'json').execute();
}

export async function down(db: Kysely<any>): Promise<void> {
  await db.schema.alterTable('roster_import_drafts').dropColumn('row_numbers').execute();
}
