import { sql, type Kysely } from 'kysely';

// Frozen in time: this file never imports application code.
export async function up(db: Kysely<any>): Promise<void> {
  await db.schema
    .createTable('shoot_days')
    .addColumn('id', 'uuid', (col) => col.primaryKey().defaultTo(sql`gen_random_uuid()`))
    .addColumn('client_id', 'uuid', (col) =>
      col.notNull().references('clients.id').onDelete('cascade'),
    )
    .addColumn('office_id', 'uuid', (col) =>
      col.notNull().references('offices.id').onDelete('restrict'),
    )
    .addColumn('day_date', 'date', (col) => col.notNull())
    .addColumn('time_zone', 'text', (col) => col.notNull())
    .addColumn('address', 'text', (col) => col.notNull())
    .addColumn('room', 'text', (col) => col.notNull().defaultTo(''))
    // Wall-clock times in the day's zone, 'HH:MM'; breaks as [{ start, end }].
    .addColumn('opens_at', 'text', (col) => col.notNull())
    .addColumn('closes_at', 'text', (col) => col.notNull())
    .addColumn('breaks', 'jsonb', (col) => col.notNull().defaultTo(sql`'[]'::jsonb`))
    .addColumn('slot_minutes', 'integer', (col) =>
      col
        .notNull()
        .defaultTo(5)
        .check(sql`slot_minutes between 3 and 60`),
    )
    .addColumn('booking_opens_at', 'timestamptz', (col) => col.notNull())
    .addColumn('booking_closes_at', 'timestamptz', (col) => col.notNull())
    .addColumn('changes_close_at', 'timestamptz', (col) => col.notNull())
    .addColumn('invite_by', 'text', (col) =>
      col.notNull().check(sql`invite_by in ('office', 'department', 'list')`),
    )
    .addColumn('invite_departments', 'jsonb', (col) => col.notNull().defaultTo(sql`'[]'::jsonb`))
    .addColumn('status', 'text', (col) =>
      col.notNull().check(sql`status in ('proposed', 'confirmed')`),
    )
    .addColumn('reminder_rounds', 'integer', (col) => col.notNull().defaultTo(0))
    .addColumn('created_by_user_id', 'uuid', (col) => col.references('users.id'))
    .addColumn('created_at', 'timestamptz', (col) => col.notNull().defaultTo(sql`now()`))
    .addCheckConstraint('shoot_days_booking_window', sql`booking_opens_at < booking_closes_at`)
    .execute();
  await sql`create index shoot_days_client on shoot_days (client_id, day_date)`.execute(db);

  await db.schema
    .createTable('stations')
    .addColumn('id', 'uuid', (col) => col.primaryKey().defaultTo(sql`gen_random_uuid()`))
    .addColumn('day_id', 'uuid', (col) =>
      col.notNull().references('shoot_days.id').onDelete('cascade'),
    )
    .addColumn('position', 'integer', (col) => col.notNull())
    .addColumn('name', 'text', (col) => col.notNull())
    // Null only while a coordinator's proposal waits for the studio to staff it.
    .addColumn('photographer_id', 'uuid', (col) => col.references('users.id'))
    .addUniqueConstraint('stations_day_position', ['day_id', 'position'])
    .execute();
  await sql`create index stations_photographer on stations (photographer_id)`.execute(db);

  await db.schema
    .createTable('day_invitees')
    .addColumn('day_id', 'uuid', (col) =>
      col.notNull().references('shoot_days.id').onDelete('cascade'),
    )
    .addColumn('person_id', 'uuid', (col) =>
      col.notNull().references('people.id').onDelete('cascade'),
    )
    .addPrimaryKeyConstraint('day_invitees_pk', ['day_id', 'person_id'])
    .execute();

  await db.schema
    .createTable('bookings')
    .addColumn('id', 'uuid', (col) => col.primaryKey().defaultTo(sql`gen_random_uuid()`))
    .addColumn('day_id', 'uuid', (col) =>
      col.notNull().references('shoot_days.id').onDelete('cascade'),
    )
    .addColumn('station_id', 'uuid', (col) =>
      col.notNull().references('stations.id').onDelete('cascade'),
    )
    .addColumn('person_id', 'uuid', (col) =>
      col.notNull().references('people.id').onDelete('cascade'),
    )
    .addColumn('starts_at', 'timestamptz', (col) => col.notNull())
    .addColumn('status', 'text', (col) =>
      col
        .notNull()
        .defaultTo('active')
        .check(sql`status in ('active', 'cancelled')`),
    )
    .addColumn('pass_token', 'text', (col) => col.notNull().unique())
    .addColumn('calendar_uid', 'text', (col) => col.notNull().unique())
    .addColumn('sequence', 'integer', (col) => col.notNull().defaultTo(0))
    .addColumn('preferred_name', 'text')
    .addColumn('glasses', 'boolean', (col) => col.notNull().defaultTo(false))
    .addColumn('access_needs', 'text')
    .addColumn('flash_sensitive', 'boolean', (col) => col.notNull().defaultTo(false))
    .addColumn('booked_by_user_id', 'uuid', (col) => col.references('users.id'))
    .addColumn('created_at', 'timestamptz', (col) => col.notNull().defaultTo(sql`now()`))
    .addColumn('updated_at', 'timestamptz', (col) => col.notNull().defaultTo(sql`now()`))
    .execute();
  // The two invariants the booking code relies on, held by the database itself:
  // one sitter per seat (station x slot start), one active booking per sitter per day.
  await sql`create unique index bookings_one_per_seat on bookings (station_id, starts_at) where status = 'active'`.execute(
    db,
  );
  await sql`create unique index bookings_one_per_sitter_day on bookings (day_id, person_id) where status = 'active'`.execute(
    db,
  );
  await sql`create index bookings_day_start on bookings (day_id, starts_at)`.execute(db);

  await db.schema
    .createTable('day_mailings')
    .addColumn('id', 'uuid', (col) => col.primaryKey().defaultTo(sql`gen_random_uuid()`))
    .addColumn('day_id', 'uuid', (col) =>
      col.notNull().references('shoot_days.id').onDelete('cascade'),
    )
    .addColumn('person_id', 'uuid', (col) =>
      col.notNull().references('people.id').onDelete('cascade'),
    )
    .addColumn('kind', 'text', (col) =>
      col.notNull().check(sql`kind in ('invitation', 'reminder', 'day_before')`),
    )
    .addColumn('round', 'integer', (col) => col.notNull().defaultTo(1))
    .addColumn('status', 'text', (col) =>
      col
        .notNull()
        .defaultTo('queued')
        .check(sql`status in ('queued', 'sent', 'failed')`),
    )
    .addColumn('reason', 'text')
    .addColumn('queued_at', 'timestamptz', (col) => col.notNull().defaultTo(sql`now()`))
    .addColumn('sent_at', 'timestamptz')
    // Sending twice never duplicates: one row per person, kind and round.
    .addUniqueConstraint('day_mailings_once', ['day_id', 'person_id', 'kind', 'round'])
    .execute();

  // A small PostgreSQL-backed queue: workers claim rows with FOR UPDATE SKIP LOCKED.
  await db.schema
    .createTable('job_queue')
    .addColumn('id', 'bigserial', (col) => col.primaryKey())
    .addColumn('kind', 'text', (col) => col.notNull())
    .addColumn('payload', 'jsonb', (col) => col.notNull())
    .addColumn('run_at', 'timestamptz', (col) => col.notNull().defaultTo(sql`now()`))
    .addColumn('attempts', 'integer', (col) => col.notNull().defaultTo(0))
    .addColumn('locked_until', 'timestamptz')
    .addColumn('done_at', 'timestamptz')
    .addColumn('last_error', 'text')
    .execute();
  await sql`create index job_queue_pending on job_queue (run_at) where done_at is null`.execute(db);
}

export async function down(db: Kysely<any>): Promise<void> {
  for (const table of [
    'job_queue',
    'day_mailings',
    'bookings',
    'day_invitees',
    'stations',
    'shoot_days',
  ]) {
    await db.schema.dropTable(table).execute();
  }
}
