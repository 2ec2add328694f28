import { sql, type Kysely } from 'kysely';

// Frozen in time: this file never imports application code.
export async function up(db: Kysely<any>): Promise<void> {
  // One row per match run of a day: what started it, what it found, and which automatic
  // results changed since the run before (so a re-run can say so).
  await db.schema
    .createTable('match_runs')
    .addColumn('id', 'uuid', (col) => col.primaryKey())
    .addColumn('day_id', 'uuid', (col) =>
      col.notNull().references('shoot_days.id').onDelete('cascade'),
    )
    .addColumn('cause', 'text', (col) =>
      col.notNull().check(sql`cause in ('frames', 'sittings', 'on_demand')`),
    )
    .addColumn('requested_by_user_id', 'uuid', (col) =>
      col.references('users.id').onDelete('set null'),
    )
    .addColumn('finished_at', 'timestamptz', (col) => col.notNull().defaultTo(sql`now()`))
    .addColumn('frames', 'integer', (col) => col.notNull())
    .addColumn('matched', 'integer', (col) => col.notNull())
    .addColumn('conflicts', 'integer', (col) => col.notNull())
    .addColumn('leftovers', 'integer', (col) => col.notNull())
    .addColumn('changed', 'integer', (col) => col.notNull())
    // At most a few hundred changed frames are kept for display; `changed` is the full count.
    .addColumn('changes', 'jsonb', (col) => col.notNull().defaultTo(sql`'[]'::jsonb`))
    .addColumn('camera_offsets', 'jsonb', (col) => col.notNull().defaultTo(sql`'{}'::jsonb`))
    .addColumn('typed_frame_mismatches', 'jsonb', (col) =>
      col.notNull().defaultTo(sql`'[]'::jsonb`),
    )
    .execute();
  await sql`create index match_runs_day on match_runs (day_id, finished_at desc)`.execute(db);

  // What the evidence alone says about each frame; people's decisions are kept apart, so a
  // re-run can never undo them.
  await db.schema
    .createTable('frame_matches')
    .addColumn('frame_id', 'uuid', (col) =>
      col.primaryKey().references('frames.id').onDelete('cascade'),
    )
    .addColumn('day_id', 'uuid', (col) =>
      col.notNull().references('shoot_days.id').onDelete('cascade'),
    )
    .addColumn('run_id', 'uuid', (col) =>
      col.notNull().references('match_runs.id').onDelete('cascade'),
    )
    .addColumn('sitting_id', 'uuid', (col) => col.references('sittings.id').onDelete('set null'))
    .addColumn('person_id', 'uuid', (col) => col.references('people.id').onDelete('set null'))
    .addColumn('reason', 'text', (col) =>
      col
        .notNull()
        .check(
          sql`reason in ('slate', 'after_slate', 'capture_time', 'frame_number', 'conflict', 'leftover')`,
        ),
    )
    .addColumn('confidence', 'real', (col) => col.notNull().check(sql`confidence between 0 and 1`))
    .addColumn('candidates', sql`uuid[]`, (col) => col.notNull().defaultTo(sql`'{}'`))
    .execute();
  await sql`create index frame_matches_day on frame_matches (day_id, sitting_id)`.execute(db);

  // People's decisions: one row per frame per change; one change (a drag of a range) shares a
  // change id, so "undo" takes back exactly that change and an older decision shows again.
  await db.schema
    .createTable('match_decisions')
    .addColumn('id', 'uuid', (col) => col.primaryKey())
    .addColumn('day_id', 'uuid', (col) =>
      col.notNull().references('shoot_days.id').onDelete('cascade'),
    )
    .addColumn('change_id', 'uuid', (col) => col.notNull())
    .addColumn('frame_id', 'uuid', (col) =>
      col.notNull().references('frames.id').onDelete('cascade'),
    )
    .addColumn('action', 'text', (col) =>
      col.notNull().check(sql`action in ('move', 'test_frame', 'split')`),
    )
    .addColumn('person_id', 'uuid', (col) => col.references('people.id').onDelete('cascade'))
    .addColumn('sitting_id', 'uuid', (col) => col.references('sittings.id').onDelete('set null'))
    .addColumn('decided_by_user_id', 'uuid', (col) =>
      col.references('users.id').onDelete('set null'),
    )
    .addColumn('decided_at', 'timestamptz', (col) => col.notNull().defaultTo(sql`now()`))
    .addColumn('undone_at', 'timestamptz')
    .addCheckConstraint(
      'match_decisions_person_unless_test_frame',
      sql`(action = 'test_frame') = (person_id is null)`,
    )
    .execute();
  await sql`create index match_decisions_day on match_decisions (day_id, frame_id, decided_at desc) where undone_at is null`.execute(
    db,
  );
  await sql`create index match_decisions_change on match_decisions (change_id)`.execute(db);

  // Any change to a day's sittings (started, finished, frame numbers corrected, undone) queues
  // one match run for the day once it has frames; the job key folds a burst into one run.
  await sql`
    create function queue_day_match_after_sitting_change() returns trigger
    language plpgsql as $$
    declare
      changed_day uuid := coalesce(new.day_id, old.day_id);
    begin
      if exists (select 1 from frames where day_id = changed_day) then
        perform graphile_worker.add_job(
          'match_day',
          json_build_object('dayId', changed_day, 'cause', 'sittings'),
          job_key => 'match:' || changed_day,
          job_key_mode => 'preserve_run_at',
          max_attempts => 3
        );
      end if;
      return null;
    end
    $$`.execute(db);
  await sql`
    create trigger sittings_queue_day_match
    after insert or update or delete on sittings
    for each row execute function queue_day_match_after_sitting_change()`.execute(db);
}

export async function down(db: Kysely<any>): Promise<void> {
  await sql`drop trigger sittings_queue_day_match on sittings`.execute(db);
  await sql`drop function queue_day_match_after_sitting_change()`.execute(db);
  await db.schema.dropTable('match_decisions').execute();
  await db.schema.dropTable('frame_matches').execute();
  await db.schema.dropTable('match_runs').execute();
}
