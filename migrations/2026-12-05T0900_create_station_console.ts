import { sql, type Kysely } from 'kysely';

// Frozen in time: this file never imports application code.
export async function up(db: Kysely<any>): Promise<void> {
  // How long after a booked start a sitter who has not arrived may be marked no-show.
  await db.schema
    .alterTable('shoot_days')
    .addColumn('no_show_grace_minutes', 'integer', (col) =>
      col
        .notNull()
        .defaultTo(10)
        .check(sql`no_show_grace_minutes between 0 and 120`),
    )
    .execute();

  // Walk-ins not on the roster join it, marked with the day they were added on.
  await db.schema
    .alterTable('people')
    .addColumn('added_on_day_id', 'uuid', (col) =>
      col.references('shoot_days.id').onDelete('set null'),
    )
    .execute();

  // Every console action as the tablet sent it: who, on which station, server and tablet time.
  // The idempotency key makes a replayed action (offline queue, retried request) a no-op.
  await db.schema
    .createTable('station_actions')
    .addColumn('id', 'bigserial', (col) => col.primaryKey())
    .addColumn('idempotency_key', 'uuid', (col) => col.notNull().unique())
    .addColumn('day_id', 'uuid', (col) =>
      col.notNull().references('shoot_days.id').onDelete('cascade'),
    )
    .addColumn('station_id', 'uuid', (col) =>
      col.notNull().references('stations.id').onDelete('cascade'),
    )
    .addColumn('user_id', 'uuid', (col) => col.references('users.id').onDelete('set null'))
    .addColumn('kind', 'text', (col) => col.notNull())
    .addColumn('payload', 'jsonb', (col) => col.notNull())
    .addColumn('result', 'jsonb', (col) => col.notNull())
    .addColumn('tablet_at', 'timestamptz', (col) => col.notNull())
    .addColumn('received_at', 'timestamptz', (col) => col.notNull())
    .execute();
  await sql`create index station_actions_day on station_actions (day_id, received_at)`.execute(db);

  await db.schema
    .createTable('check_ins')
    .addColumn('id', 'uuid', (col) => col.primaryKey())
    .addColumn('day_id', 'uuid', (col) =>
      col.notNull().references('shoot_days.id').onDelete('cascade'),
    )
    .addColumn('person_id', 'uuid', (col) =>
      col.notNull().references('people.id').onDelete('cascade'),
    )
    .addColumn('booking_id', 'uuid', (col) => col.references('bookings.id').onDelete('set null'))
    .addColumn('station_id', 'uuid', (col) =>
      col.notNull().references('stations.id').onDelete('cascade'),
    )
    .addColumn('method', 'text', (col) =>
      col.notNull().check(sql`method in ('pass', 'search', 'walk_in', 'new_person')`),
    )
    .addColumn('checked_in_at', 'timestamptz', (col) => col.notNull())
    .addColumn('tablet_at', 'timestamptz', (col) => col.notNull())
    .addColumn('by_user_id', 'uuid', (col) => col.references('users.id').onDelete('set null'))
    .addColumn('undone_at', 'timestamptz')
    .execute();
  // Two tablets checking in the same sitter at once: one row wins, the other insert fails.
  await sql`create unique index check_ins_one_per_person_day on check_ins (day_id, person_id) where undone_at is null`.execute(
    db,
  );
  await sql`create unique index check_ins_one_per_booking on check_ins (booking_id) where undone_at is null`.execute(
    db,
  );

  await db.schema
    .createTable('sittings')
    .addColumn('id', 'uuid', (col) => col.primaryKey())
    .addColumn('day_id', 'uuid', (col) =>
      col.notNull().references('shoot_days.id').onDelete('cascade'),
    )
    .addColumn('station_id', 'uuid', (col) =>
      col.notNull().references('stations.id').onDelete('cascade'),
    )
    .addColumn('person_id', 'uuid', (col) =>
      col.notNull().references('people.id').onDelete('cascade'),
    )
    .addColumn('check_in_id', 'uuid', (col) =>
      col.notNull().references('check_ins.id').onDelete('cascade'),
    )
    // What the slate's QR code carries; the matcher finds the slate frame by it.
    .addColumn('slate_token', 'text', (col) => col.notNull().unique())
    // DCF file numbers run 0001-9999 (JEITA CP-3461).
    .addColumn('first_frame', 'integer', (col) =>
      col.notNull().check(sql`first_frame between 1 and 9999`),
    )
    .addColumn('last_frame', 'integer', (col) => col.check(sql`last_frame between 1 and 9999`))
    .addColumn('started_at', 'timestamptz', (col) => col.notNull())
    .addColumn('tablet_started_at', 'timestamptz', (col) => col.notNull())
    .addColumn('started_by_user_id', 'uuid', (col) =>
      col.references('users.id').onDelete('set null'),
    )
    .addColumn('finished_at', 'timestamptz')
    .addColumn('tablet_finished_at', 'timestamptz')
    .addColumn('finished_by_user_id', 'uuid', (col) =>
      col.references('users.id').onDelete('set null'),
    )
    .addColumn('undone_at', 'timestamptz')
    .execute();
  // A station seats one sitter at a time.
  await sql`create unique index sittings_one_open_per_station on sittings (station_id) where finished_at is null and undone_at is null`.execute(
    db,
  );
  await sql`create index sittings_day on sittings (day_id, started_at)`.execute(db);

  await db.schema
    .createTable('no_shows')
    .addColumn('id', 'uuid', (col) => col.primaryKey())
    .addColumn('day_id', 'uuid', (col) =>
      col.notNull().references('shoot_days.id').onDelete('cascade'),
    )
    .addColumn('booking_id', 'uuid', (col) =>
      col.notNull().references('bookings.id').onDelete('cascade'),
    )
    .addColumn('station_id', 'uuid', (col) =>
      col.notNull().references('stations.id').onDelete('cascade'),
    )
    .addColumn('marked_at', 'timestamptz', (col) => col.notNull())
    .addColumn('tablet_at', 'timestamptz', (col) => col.notNull())
    .addColumn('by_user_id', 'uuid', (col) => col.references('users.id').onDelete('set null'))
    .addColumn('undone_at', 'timestamptz')
    .execute();
  await sql`create unique index no_shows_one_per_booking on no_shows (booking_id) where undone_at is null`.execute(
    db,
  );
}

export async function down(db: Kysely<any>): Promise<void> {
  for (const table of ['no_shows', 'sittings', 'check_ins', 'station_actions']) {
    await db.schema.dropTable(table).execute();
  }
  await db.schema.alterTable('people').dropColumn('added_on_day_id').execute();
  await db.schema.alterTable('shoot_days').dropColumn('no_show_grace_minutes').execute();
}
