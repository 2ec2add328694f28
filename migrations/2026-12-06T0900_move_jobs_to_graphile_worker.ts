import { sql, type Kysely } from 'kysely';

// Frozen in time: this file never imports application code.
export async function up(db: Kysely<any>): Promise<void> {
  // The migrator installs graphile-worker's schema before this runs, so jobs still waiting in
  // the old table (a confirmation not yet sent) carry over with the attempts they have left.
  // Without that schema (a bare Kysely migration run) there is nowhere to carry them.
  await sql`
    do $$
    begin
      if to_regproc('graphile_worker.add_job') is not null then
        perform graphile_worker.add_job(
          kind,
          payload::json,
          run_at => run_at,
          max_attempts => greatest(3 - attempts, 1)
        )
        from job_queue
        where done_at is null
        order by id;
      end if;
    end
    $$`.execute(db);
  await db.schema.dropTable('job_queue').execute();
}

export async function down(db: Kysely<any>): Promise<void> {
  // The old queue comes back empty: jobs stay with graphile-worker.
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
