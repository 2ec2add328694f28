import { sql, type Kysely } from 'kysely';

/**
 * A draft keeps the uploaded file's bytes instead of its rows as JSON: at 50,000 rows the JSON
 * took about 20 ms to build and 30–50 ms for PostgreSQL to check and store, while the bytes go
 * over as they are (a binary parameter) and are parsed again only when the draft is remapped
 * or its rows to fix are downloaded. Stored uncompressed (EXTERNAL): compressing 4 MB on every
 * upload costs more than the space it saves on a table of drafts that live a day.
 *
 * Drafts from before keep their raw_rows (now optional) until they are saved or expire.
 */
export async function up(db: Kysely<any>): Promise<void> {
  await db.schema.alterTable('roster_import_drafts').addColumn('file_bytes', 'bytea').execute();
  await sql`alter table roster_import_drafts alter column file_bytes set storage external,
    alter column raw_rows drop not null`.execute(db);
  await sql`alter table roster_import_drafts add constraint roster_import_drafts_file_kept
    check (file_bytes is not null or raw_rows is not null)`.execute(db);
}

export async function down(db: Kysely<any>): Promise<void> {
  // The rows of newer drafts exist only as bytes, which SQL cannot parse: those drafts go.
  await sql`delete from roster_import_rows where draft_id in
    (select id from roster_import_drafts where raw_rows is null)`.execute(db);
  await sql`delete from roster_import_drafts where raw_rows is null`.execute(db);
  await sql`alter table roster_import_drafts drop constraint roster_import_drafts_file_kept,
    alter column raw_rows set not null`.execute(db);
  await db.schema.alterTable('roster_import_drafts').dropColumn('file_bytes').execute();
}
