import { sql, type Kysely } from 'kysely';

/**
 * A draft keeps the file's rows only for remapping and the download of rows to fix, so they
 * are stored as `json` (checked, kept as sent) rather than `jsonb` (converted on the way in:
 * a tenth of a 50,000-row preview's time). The row count and the first rows, which every view
 * of a draft shows, get columns of their own instead of being read out of the whole document.
 */
export async function up(db: Kysely<any>): Promise<void> {
  await db.schema
    .alterTable('roster_import_drafts')
    .addColumn('row_count', 'integer', (col) => col.notNull().defaultTo(0))
    .addColumn('sample_rows', 'jsonb', (col) => col.notNull().defaultTo(sql`'[]'::jsonb`))
    .execute();
  await sql`update roster_import_drafts set row_count = jsonb_array_length(raw_rows),
    sample_rows = jsonb_path_query_array(raw_rows, '$[0 to 2]')`.execute(db);
  // Nor compressed: a draft lives a day at most, and pglz on megabytes costs more than it saves.
  await sql`alter table roster_import_drafts alter column raw_rows type json using raw_rows::json,
    alter column raw_rows set storage external`.execute(db);
}

export async function down(db: Kysely<any>): Promise<void> {
  await sql`alter table roster_import_drafts alter column raw_rows type jsonb using raw_rows::jsonb,
    alter column raw_rows set storage extended`.execute(db);
  await db.schema
    .alterTable('roster_import_drafts')
    .dropColumn('row_count')
    .dropColumn('sample_rows')
    .execute();
}
