import { sql, type Kysely } from 'kysely';

// Frozen in time: this file never imports application code.
export async function up(db: Kysely<any>): Promise<void> {
  await db.schema
    .createTable('clients')
    .addColumn('id', 'uuid', (col) => col.primaryKey().defaultTo(sql`gen_random_uuid()`))
    .addColumn('name', 'text', (col) => col.notNull())
    .addColumn('slug', 'text', (col) => col.notNull().unique())
    .addColumn('created_at', 'timestamptz', (col) => col.notNull().defaultTo(sql`now()`))
    .execute();

  await db.schema
    .createTable('users')
    .addColumn('id', 'uuid', (col) => col.primaryKey().defaultTo(sql`gen_random_uuid()`))
    .addColumn('email', 'text', (col) => col.notNull())
    .addColumn('display_name', 'text', (col) => col.notNull())
    .addColumn('role', 'text', (col) =>
      col.notNull().check(sql`role in ('studio_admin', 'photographer', 'coordinator')`),
    )
    .addColumn('client_id', 'uuid', (col) => col.references('clients.id').onDelete('restrict'))
    .addColumn('password_hash', 'text')
    .addColumn('active', 'boolean', (col) => col.notNull().defaultTo(true))
    .addColumn('created_at', 'timestamptz', (col) => col.notNull().defaultTo(sql`now()`))
    .addColumn('last_signed_in_at', 'timestamptz')
    // A coordinator belongs to exactly one client; studio staff belong to none.
    .addCheckConstraint(
      'users_client_matches_role',
      sql`(role = 'coordinator') = (client_id is not null)`,
    )
    .execute();
  await sql`create unique index users_email_unique on users (lower(email))`.execute(db);

  await db.schema
    .createTable('offices')
    .addColumn('id', 'uuid', (col) => col.primaryKey().defaultTo(sql`gen_random_uuid()`))
    .addColumn('client_id', 'uuid', (col) =>
      col.notNull().references('clients.id').onDelete('cascade'),
    )
    .addColumn('name', 'text', (col) => col.notNull())
    .addColumn('time_zone', 'text', (col) => col.notNull())
    .addColumn('created_at', 'timestamptz', (col) => col.notNull().defaultTo(sql`now()`))
    .execute();
  await sql`create unique index offices_client_name_unique on offices (client_id, lower(name))`.execute(
    db,
  );

  await db.schema
    .createTable('people')
    .addColumn('id', 'uuid', (col) => col.primaryKey().defaultTo(sql`gen_random_uuid()`))
    .addColumn('client_id', 'uuid', (col) =>
      col.notNull().references('clients.id').onDelete('cascade'),
    )
    .addColumn('office_id', 'uuid', (col) => col.references('offices.id').onDelete('set null'))
    .addColumn('given_name', 'text', (col) => col.notNull())
    .addColumn('family_name', 'text', (col) => col.notNull())
    .addColumn('preferred_name', 'text')
    .addColumn('email', 'text', (col) => col.notNull())
    .addColumn('employee_id', 'text')
    .addColumn('department', 'text')
    .addColumn('job_title', 'text')
    .addColumn('active', 'boolean', (col) => col.notNull().defaultTo(true))
    .addColumn('created_at', 'timestamptz', (col) => col.notNull().defaultTo(sql`now()`))
    .addColumn('updated_at', 'timestamptz', (col) => col.notNull().defaultTo(sql`now()`))
    .execute();
  await sql`create unique index people_client_email_unique on people (client_id, lower(email))`.execute(
    db,
  );
  await sql`create unique index people_client_employee_id_unique on people (client_id, employee_id) where employee_id is not null`.execute(
    db,
  );
  await sql`create index people_email_lookup on people (lower(email))`.execute(db);

  await db.schema
    .createTable('sessions')
    .addColumn('id', 'uuid', (col) => col.primaryKey().defaultTo(sql`gen_random_uuid()`))
    .addColumn('token_hash', 'text', (col) => col.notNull().unique())
    .addColumn('user_id', 'uuid', (col) => col.references('users.id').onDelete('cascade'))
    .addColumn('person_id', 'uuid', (col) => col.references('people.id').onDelete('cascade'))
    .addColumn('created_at', 'timestamptz', (col) => col.notNull().defaultTo(sql`now()`))
    .addColumn('expires_at', 'timestamptz', (col) => col.notNull())
    .addColumn('ip_address', 'text')
    .addColumn('user_agent', 'text')
    .addCheckConstraint('sessions_one_subject', sql`(user_id is null) <> (person_id is null)`)
    .execute();

  await sql`create index sessions_expires_at on sessions (expires_at)`.execute(db);

  await db.schema
    .createTable('link_tokens')
    .addColumn('id', 'uuid', (col) => col.primaryKey().defaultTo(sql`gen_random_uuid()`))
    .addColumn('token_hash', 'text', (col) => col.notNull().unique())
    .addColumn('purpose', 'text', (col) =>
      col
        .notNull()
        .check(
          sql`purpose in ('sitter_sign_in', 'sitter_invitation', 'set_password', 'reset_password')`,
        ),
    )
    .addColumn('user_id', 'uuid', (col) => col.references('users.id').onDelete('cascade'))
    .addColumn('person_id', 'uuid', (col) => col.references('people.id').onDelete('cascade'))
    .addColumn('created_at', 'timestamptz', (col) => col.notNull().defaultTo(sql`now()`))
    .addColumn('expires_at', 'timestamptz', (col) => col.notNull())
    .addColumn('used_at', 'timestamptz')
    .addCheckConstraint('link_tokens_one_subject', sql`(user_id is null) <> (person_id is null)`)
    .execute();

  await db.schema
    .createTable('rate_limit_counters')
    .addColumn('key', 'text', (col) => col.primaryKey())
    .addColumn('hits', 'integer', (col) => col.notNull())
    .addColumn('resets_at', 'timestamptz', (col) => col.notNull())
    .execute();

  await db.schema
    .createTable('audit_events')
    .addColumn('id', 'bigserial', (col) => col.primaryKey())
    .addColumn('occurred_at', 'timestamptz', (col) => col.notNull().defaultTo(sql`now()`))
    .addColumn('actor_user_id', 'uuid', (col) => col.references('users.id').onDelete('set null'))
    .addColumn('action', 'text', (col) => col.notNull())
    .addColumn('subject_type', 'text', (col) => col.notNull())
    .addColumn('subject_id', 'text')
    .addColumn('details', 'jsonb', (col) => col.notNull().defaultTo(sql`'{}'::jsonb`))
    .execute();

  // Marks that the demo scenario was loaded, so a second start never loads it twice.
  await db.schema
    .createTable('installation_facts')
    .addColumn('name', 'text', (col) => col.primaryKey())
    .addColumn('value', 'text', (col) => col.notNull())
    .addColumn('recorded_at', 'timestamptz', (col) => col.notNull().defaultTo(sql`now()`))
    .execute();
}

export async function down(db: Kysely<any>): Promise<void> {
  for (const table of [
    'installation_facts',
    'audit_events',
    'rate_limit_counters',
    'link_tokens',
    'sessions',
    'people',
    'offices',
    'users',
    'clients',
  ]) {
    await db.schema.dropTable(table).ifExists().execute();
  }
}
