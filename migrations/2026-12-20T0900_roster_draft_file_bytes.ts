import { sql, type Kysely } from 'kysely';

/**
 * A draft keeps the uploaded file's bytes (roster_import_files) instead of its rows as JSON:
 * at 50,000 rows the JSON took about 20 ms to build and 30–50 ms for PostgreSQL to check and
 * store, while the bytes go over as they are (a binary parameter), written while the file is
 * parsed, and are parsed again only when the draft is remapped or its rows to fix are
 * downloaded. A table of its own, so the upload can store them before the draft's own row is
 * known. Stored uncompressed (EXTERNAL): compressing 4 MB on every upload costs more than the
 * space it saves on drafts that live a day. Unlogged like the drafts.
 *
 * Drafts from before keep their raw_rows (now optional) until they are saved or expire.
 */
export async function up(db: Kysely<any>): Promise<void> {
  await sql`create unlogged table roster_import_files (
    draft_id uuid primary key
      references roster_import_drafts (id) on delete cascade deferrable initially deferred,
    bytes bytea not null
  )`.execute(db);
  await sql`alter table roster_import_files alter column bytes set storage external`.execute(db);
  await sql`alter table roster_import_drafts alter column raw_rows drop not null`.execute(db);
}

export async function down(db: Kysely<any>): Promise<void> {
  // The rows of newer drafts exist only as bytes, which SQL cannot parse: those drafts go.
  await sql`delete from roster_import_rows where draft_id in
    (select id from roster_import_drafts where raw_rows is null)`.execute(db);
  await sql`delete from roster_import_drafts where raw_rows is null`.execute(db);
  await sql`drop table roster_import_files`.execute(db);
  await sql`alter table roster_import_drafts alter column raw_rows set not null`.execute(db);
}
