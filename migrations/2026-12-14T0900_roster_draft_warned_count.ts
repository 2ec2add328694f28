import { sql, type Kysely } from 'kysely';

/**
 * How many preview rows carry a warning, kept with the draft when its preview is computed:
 * every view of a draft showed it, and counting it scanned all of the draft's preview rows
 * (50,000 of them for a large client) on each view.
 */
export async function up(db: Kysely<any>): Promise<void> {
  await db.schema
    .alterTable('roster_import_drafts')
    .addColumn('rows_with_warnings', 'integer', (col) => col.notNull().defaultTo(0))
    .execute();
  await sql`update roster_import_drafts d set rows_with_warnings = (
    select count(*) from roster_import_rows r
    where r.draft_id = d.id
      and coalesce(r.detail -> 'warnings', '{}'::jsonb) <> '{}'::jsonb)`.execute(db);
}

export async function down(db: Kysely<any>): Promise<void> {
  await db.schema.alterTable('roster_import_drafts').dropColumn('rows_with_warnings').execute();
}
