import { sql, type Kysely } from 'kysely';

// Frozen in time: this file never imports application code.
export async function up(db: Kysely<any>): Promise<void> {
  // A row whose e-mail belongs to a person with another employee id is a conflict of its own:
  // never applied unless the coordinator says they are the same people.
  await sql`alter table roster_import_rows drop constraint roster_import_rows_kind_check`.execute(
    db,
  );
  await sql`alter table roster_import_rows add constraint roster_import_rows_kind_check
    check (kind in ('add', 'update', 'unchanged', 'error', 'missing', 'conflict'))`.execute(db);

  // The rows-to-fix file is written back the way the upload came (byte order mark included),
  // and what decoding changed in a cell (control characters removed) stays with the draft so
  // a remap still shows it.
  await db.schema
    .alterTable('roster_import_drafts')
    .addColumn('had_byte_order_mark', 'boolean', (col) => col.notNull().defaultTo(false))
    .addColumn('decode_warnings', 'jsonb', (col) => col.notNull().defaultTo(sql`'[]'::jsonb`))
    // Columns whose field was guessed from their values, not their header: the mapping step
    // says so, so the coordinator checks them.
    .addColumn('guessed_columns', 'jsonb', (col) => col.notNull().defaultTo(sql`'[]'::jsonb`))
    .execute();
  await sql`create index roster_import_drafts_uploader on roster_import_drafts (client_id, created_by)`.execute(
    db,
  );

  // Which draft an import came from: a second commit of the same draft answers with this
  // import instead of "not found".
  await db.schema.alterTable('roster_imports').addColumn('draft_id', 'uuid').execute();
  await sql`create unique index roster_imports_draft on roster_imports (draft_id) where draft_id is not null`.execute(
    db,
  );
}

export async function down(db: Kysely<any>): Promise<void> {
  await db.schema.dropIndex('roster_imports_draft').ifExists().execute();
  await db.schema.alterTable('roster_imports').dropColumn('draft_id').execute();
  await db.schema.dropIndex('roster_import_drafts_uploader').ifExists().execute();
  await db.schema
    .alterTable('roster_import_drafts')
    .dropColumn('had_byte_order_mark')
    .dropColumn('decode_warnings')
    .dropColumn('guessed_columns')
    .execute();
  await sql`delete from roster_import_rows where kind = 'conflict'`.execute(db);
  await sql`alter table roster_import_rows drop constraint roster_import_rows_kind_check`.execute(
    db,
  );
  await sql`alter table roster_import_rows add constraint roster_import_rows_kind_check
    check (kind in ('add', 'update', 'unchanged', 'error', 'missing'))`.execute(db);
}
