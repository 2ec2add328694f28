import { sql, type Kysely } from 'kysely';

// Frozen in time: this file never imports application code.
export async function up(db: Kysely<any>): Promise<void> {
  // Columns an HR export carries that Likeness has no field for, kept as they came.
  await db.schema
    .alterTable('people')
    .addColumn('extras', 'jsonb', (col) => col.notNull().defaultTo(sql`'{}'::jsonb`))
    .execute();
  // The directory pages, sorts and filters one client's people; these keep it fast at 50,000.
  await sql`create index people_client_name on people (client_id, family_name, given_name, id)`.execute(
    db,
  );
  await sql`create index people_client_office on people (client_id, office_id)`.execute(db);
  await sql`create index people_client_department on people (client_id, department)`.execute(db);
  await sql`create index people_office on people (office_id)`.execute(db);

  // A parsed upload waiting for the coordinator's confirmation; nothing on the roster changes
  // until commit, which applies exactly these rows.
  await db.schema
    .createTable('roster_import_drafts')
    .addColumn('id', 'uuid', (col) => col.primaryKey().defaultTo(sql`gen_random_uuid()`))
    .addColumn('client_id', 'uuid', (col) =>
      col.notNull().references('clients.id').onDelete('cascade'),
    )
    .addColumn('created_by', 'uuid', (col) => col.references('users.id').onDelete('cascade'))
    .addColumn('file_name', 'text', (col) => col.notNull())
    .addColumn('encoding', 'text', (col) => col.notNull())
    .addColumn('delimiter', 'text', (col) => col.notNull())
    .addColumn('headers', 'jsonb', (col) => col.notNull())
    .addColumn('raw_rows', 'jsonb', (col) => col.notNull())
    .addColumn('mapping', 'jsonb', (col) => col.notNull())
    .addColumn('counts', 'jsonb', (col) => col.notNull())
    .addColumn('new_offices', 'jsonb', (col) => col.notNull())
    .addColumn('roster_version', 'text', (col) => col.notNull())
    .addColumn('created_at', 'timestamptz', (col) => col.notNull().defaultTo(sql`now()`))
    .addColumn('expires_at', 'timestamptz', (col) => col.notNull())
    .execute();
  await sql`create index roster_import_drafts_client on roster_import_drafts (client_id)`.execute(
    db,
  );

  await db.schema
    .createTable('roster_import_rows')
    .addColumn('draft_id', 'uuid', (col) =>
      col.notNull().references('roster_import_drafts.id').onDelete('cascade'),
    )
    .addColumn('position', 'integer', (col) => col.notNull())
    .addColumn('row_number', 'integer')
    .addColumn('kind', 'text', (col) =>
      col.notNull().check(sql`kind in ('add', 'update', 'unchanged', 'error', 'missing')`),
    )
    .addColumn('person_id', 'uuid')
    .addColumn('sort_name', 'text', (col) => col.notNull())
    .addColumn('email', 'text', (col) => col.notNull())
    .addColumn('data', 'jsonb', (col) => col.notNull())
    .addPrimaryKeyConstraint('roster_import_rows_pk', ['draft_id', 'position'])
    .execute();
  await sql`create index roster_import_rows_kind on roster_import_rows (draft_id, kind, position)`.execute(
    db,
  );

  // Import history: who, when, which file, what it did. Counts only, no personal data.
  await db.schema
    .createTable('roster_imports')
    .addColumn('id', 'uuid', (col) => col.primaryKey().defaultTo(sql`gen_random_uuid()`))
    .addColumn('client_id', 'uuid', (col) =>
      col.notNull().references('clients.id').onDelete('cascade'),
    )
    .addColumn('imported_by', 'uuid', (col) => col.references('users.id').onDelete('set null'))
    .addColumn('file_name', 'text', (col) => col.notNull())
    .addColumn('imported_at', 'timestamptz', (col) => col.notNull().defaultTo(sql`now()`))
    .addColumn('added', 'integer', (col) => col.notNull())
    .addColumn('updated', 'integer', (col) => col.notNull())
    .addColumn('unchanged', 'integer', (col) => col.notNull())
    .addColumn('deactivated', 'integer', (col) => col.notNull())
    .addColumn('skipped', 'integer', (col) => col.notNull())
    .addColumn('offices_created', 'integer', (col) => col.notNull())
    .execute();
  await sql`create index roster_imports_client on roster_imports (client_id, imported_at desc)`.execute(
    db,
  );

  // The last column mapping per client: normalised header -> target.
  await db.schema
    .createTable('roster_mappings')
    .addColumn('client_id', 'uuid', (col) =>
      col.primaryKey().references('clients.id').onDelete('cascade'),
    )
    .addColumn('mapping', 'jsonb', (col) => col.notNull())
    .addColumn('updated_at', 'timestamptz', (col) => col.notNull().defaultTo(sql`now()`))
    .execute();
}

export async function down(db: Kysely<any>): Promise<void> {
  for (const table of [
    'roster_mappings',
    'roster_imports',
    'roster_import_rows',
    'roster_import_drafts',
  ]) {
    await db.schema.dropTable(table).ifExists().execute();
  }
  for (const index of [
    'people_client_name',
    'people_client_office',
    'people_client_department',
    'people_office',
  ]) {
    await db.schema.dropIndex(index).ifExists().execute();
  }
  await db.schema.alterTable('people').dropColumn('extras').execute();
}
