import { sql, type Kysely } from 'kysely';

// Frozen in time: this file never imports application code.
export async function up(db: Kysely<any>): Promise<void> {
  // Columns an HR export carries that Likeness has no field for, kept as they came.
  await db.schema
    .alterTable('people')
    .addColumn('extras', 'jsonb', (col) => col.notNull().defaultTo(sql`'{}'::jsonb`))
    .execute();
  // The directory's default page (one client, name order) reads this index and stops early.
  // Filters on office or department scan one client's rows, a few ms at 50,000; more indexes
  // would slow every import, which writes all of them.
  await sql`create index people_client_name on people (client_id, family_name, given_name, id)`.execute(
    db,
  );

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
    // No foreign key: its per-row check doubled the time to store a large preview. Rows go
    // with their draft in the repository (deleteDraft, deleteStaleDrafts).
    .addColumn('draft_id', 'uuid', (col) => col.notNull())
    .addColumn('position', 'integer', (col) => col.notNull())
    .addColumn('row_number', 'integer')
    .addColumn('kind', 'text', (col) =>
      col.notNull().check(sql`kind in ('add', 'update', 'unchanged', 'error', 'missing')`),
    )
    .addColumn('person_id', 'uuid')
    // The person as commit will write them (for errors: the cells as read), typed columns so
    // commit copies them without parsing JSON.
    .addColumn('given_name', 'text')
    .addColumn('family_name', 'text')
    .addColumn('preferred_name', 'text')
    .addColumn('email', 'text')
    .addColumn('employee_id', 'text')
    .addColumn('department', 'text')
    .addColumn('job_title', 'text')
    .addColumn('office', 'text')
    .addColumn('extras', 'jsonb')
    // What the preview shows besides: values before, changed fields, errors per cell.
    .addColumn('detail', 'jsonb')
    .addPrimaryKeyConstraint('roster_import_rows_pk', ['draft_id', 'position'])
    .execute();
  // Drafts are scratch data: a crash may lose them (the coordinator uploads again), so they
  // skip the write-ahead log and a 20,000-row preview is stored quickly.
  await sql`alter table roster_import_rows set unlogged`.execute(db);
  await sql`alter table roster_import_drafts set unlogged`.execute(db);

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
  await db.schema.dropIndex('people_client_name').ifExists().execute();
  await db.schema.alterTable('people').dropColumn('extras').execute();
}
