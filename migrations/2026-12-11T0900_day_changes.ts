import { sql, type Kysely } from 'kysely';

// Frozen in time: this file never imports application code.
export async function up(db: Kysely<any>): Promise<void> {
  // A day can be cancelled; its rows stay (bookings cancelled, mail log kept), never deleted.
  await sql`alter table shoot_days drop constraint shoot_days_status_check`.execute(db);
  await sql`alter table shoot_days add constraint shoot_days_status_check
    check (status in ('proposed', 'confirmed', 'cancelled'))`.execute(db);

  // A coordinator's proposed change to a day, which the studio applies or declines.
  await db.schema
    .createTable('day_change_proposals')
    .addColumn('id', 'uuid', (col) => col.primaryKey().defaultTo(sql`gen_random_uuid()`))
    .addColumn('day_id', 'uuid', (col) =>
      col.notNull().references('shoot_days.id').onDelete('cascade'),
    )
    .addColumn('kind', 'text', (col) => col.notNull().check(sql`kind in ('edit', 'cancel')`))
    // The edit as the coordinator sent it (the same shape as a studio edit), or {} to cancel.
    .addColumn('changes', 'jsonb', (col) => col.notNull().defaultTo(sql`'{}'::jsonb`))
    .addColumn('note', 'text', (col) => col.notNull().defaultTo(''))
    .addColumn('status', 'text', (col) =>
      col
        .notNull()
        .defaultTo('waiting')
        .check(sql`status in ('waiting', 'applied', 'declined')`),
    )
    .addColumn('proposed_by_user_id', 'uuid', (col) => col.references('users.id'))
    .addColumn('decided_by_user_id', 'uuid', (col) => col.references('users.id'))
    .addColumn('created_at', 'timestamptz', (col) => col.notNull().defaultTo(sql`now()`))
    .addColumn('decided_at', 'timestamptz')
    .execute();
  await sql`create index day_change_proposals_day on day_change_proposals (day_id, created_at)`.execute(
    db,
  );
  // Reminder cool-down reads the latest reminder per person and day.
  await sql`create index day_mailings_reminders on day_mailings (day_id, person_id, queued_at) where kind = 'reminder'`.execute(
    db,
  );
}

export async function down(db: Kysely<any>): Promise<void> {
  await sql`drop index if exists day_mailings_reminders`.execute(db);
  await db.schema.dropTable('day_change_proposals').execute();
  await sql`update shoot_days set status = 'confirmed' where status = 'cancelled'`.execute(db);
  await sql`alter table shoot_days drop constraint shoot_days_status_check`.execute(db);
  await sql`alter table shoot_days add constraint shoot_days_status_check
    check (status in ('proposed', 'confirmed'))`.execute(db);
}
