import { sql, type Kysely } from 'kysely';

// Frozen in time: this file never imports application code.
export async function up(db: Kysely<any>): Promise<void> {
  // What a client's package includes: portraits per sitter, extra picks and their price, and
  // whether HR may choose for staff.
  await db.schema
    .createTable('client_proof_settings')
    .addColumn('client_id', 'uuid', (col) =>
      col.primaryKey().references('clients.id').onDelete('cascade'),
    )
    .addColumn('picks_included', 'integer', (col) =>
      col
        .notNull()
        .defaultTo(1)
        .check(sql`picks_included between 1 and 20`),
    )
    .addColumn('extra_picks_allowed', 'integer', (col) =>
      col
        .notNull()
        .defaultTo(0)
        .check(sql`extra_picks_allowed between 0 and 20`),
    )
    .addColumn('extra_pick_price_cents', 'integer', (col) =>
      col
        .notNull()
        .defaultTo(0)
        .check(sql`extra_pick_price_cents between 0 and 10000000`),
    )
    .addColumn('hr_may_choose', 'boolean', (col) => col.notNull().defaultTo(false))
    .addColumn('updated_at', 'timestamptz', (col) => col.notNull().defaultTo(sql`now()`))
    .execute();

  // A day's proofs, once the studio has released them after review.
  await db.schema
    .createTable('day_proofs')
    .addColumn('day_id', 'uuid', (col) =>
      col.primaryKey().references('shoot_days.id').onDelete('cascade'),
    )
    .addColumn('released_at', 'timestamptz', (col) => col.notNull().defaultTo(sql`now()`))
    .addColumn('released_by_user_id', 'uuid', (col) =>
      col.references('users.id').onDelete('set null'),
    )
    .addColumn('picks_close_at', 'timestamptz', (col) => col.notNull())
    .addColumn('reminder_rounds', 'integer', (col) => col.notNull().defaultTo(0))
    .addColumn('settled_at', 'timestamptz')
    .execute();

  // The studio's choice per sitter, which stands if the sitter does not choose in time.
  await db.schema
    .createTable('studio_picks')
    .addColumn('day_id', 'uuid', (col) =>
      col.notNull().references('shoot_days.id').onDelete('cascade'),
    )
    .addColumn('person_id', 'uuid', (col) =>
      col.notNull().references('people.id').onDelete('cascade'),
    )
    .addColumn('frame_id', 'uuid', (col) =>
      col.notNull().references('frames.id').onDelete('cascade'),
    )
    .addColumn('chosen_by_user_id', 'uuid', (col) =>
      col.references('users.id').onDelete('set null'),
    )
    .addColumn('chosen_at', 'timestamptz', (col) => col.notNull().defaultTo(sql`now()`))
    .addPrimaryKeyConstraint('studio_picks_pk', ['day_id', 'person_id'])
    .execute();

  // A chosen frame, and the retouching that follows it. A final is stored beside the original,
  // which is never changed.
  await db.schema
    .createTable('picks')
    .addColumn('id', 'uuid', (col) => col.primaryKey())
    .addColumn('day_id', 'uuid', (col) =>
      col.notNull().references('shoot_days.id').onDelete('cascade'),
    )
    .addColumn('person_id', 'uuid', (col) =>
      col.notNull().references('people.id').onDelete('cascade'),
    )
    .addColumn('frame_id', 'uuid', (col) =>
      col.notNull().references('frames.id').onDelete('cascade'),
    )
    .addColumn('chosen_by', 'text', (col) =>
      col.notNull().check(sql`chosen_by in ('sitter', 'coordinator', 'studio', 'fallback')`),
    )
    .addColumn('chosen_by_user_id', 'uuid', (col) =>
      col.references('users.id').onDelete('set null'),
    )
    .addColumn('note', 'text', (col) => col.check(sql`char_length(note) <= 300`))
    .addColumn('position', 'integer', (col) => col.notNull().check(sql`position between 1 and 40`))
    .addColumn('retouch_status', 'text', (col) =>
      col
        .notNull()
        .defaultTo('to_do')
        .check(sql`retouch_status in ('to_do', 'in_progress', 'done')`),
    )
    .addColumn('retouch_user_id', 'uuid', (col) => col.references('users.id').onDelete('set null'))
    .addColumn('final_key', 'text')
    .addColumn('final_file_name', 'text')
    .addColumn('final_byte_size', 'bigint')
    .addColumn('final_uploaded_at', 'timestamptz')
    .addColumn('final_uploaded_by_user_id', 'uuid', (col) =>
      col.references('users.id').onDelete('set null'),
    )
    .addColumn('created_at', 'timestamptz', (col) => col.notNull().defaultTo(sql`now()`))
    .addColumn('updated_at', 'timestamptz', (col) => col.notNull().defaultTo(sql`now()`))
    .execute();
  await sql`create unique index picks_one_per_frame on picks (day_id, person_id, frame_id)`.execute(
    db,
  );
  await sql`create index picks_day on picks (day_id, retouch_status)`.execute(db);

  // Proof mail is logged per person like invitations.
  await sql`alter table day_mailings drop constraint day_mailings_kind_check`.execute(db);
  await sql`alter table day_mailings add constraint day_mailings_kind_check
    check (kind in ('invitation', 'reminder', 'day_before', 'proofs', 'proofs_reminder'))`.execute(
    db,
  );

  // A finished retouch comes back through the same resumable upload as the frames.
  await sql`alter table frame_uploads alter column station_id drop not null`.execute(db);
  await db.schema
    .alterTable('frame_uploads')
    .addColumn('purpose', 'text', (col) =>
      col
        .notNull()
        .defaultTo('frame')
        .check(sql`purpose in ('frame', 'final')`),
    )
    .addColumn('pick_id', 'uuid', (col) => col.references('picks.id').onDelete('cascade'))
    .execute();
  await sql`alter table frame_uploads add constraint frame_uploads_purpose_target
    check ((purpose = 'frame') = (station_id is not null) and (purpose = 'final') = (pick_id is not null))`.execute(
    db,
  );
}

export async function down(db: Kysely<any>): Promise<void> {
  await sql`alter table frame_uploads drop constraint frame_uploads_purpose_target`.execute(db);
  await db.schema.alterTable('frame_uploads').dropColumn('pick_id').dropColumn('purpose').execute();
  await sql`delete from frame_uploads where station_id is null`.execute(db);
  await sql`alter table frame_uploads alter column station_id set not null`.execute(db);
  await sql`delete from day_mailings where kind in ('proofs', 'proofs_reminder')`.execute(db);
  await sql`alter table day_mailings drop constraint day_mailings_kind_check`.execute(db);
  await sql`alter table day_mailings add constraint day_mailings_kind_check
    check (kind in ('invitation', 'reminder', 'day_before'))`.execute(db);
  await db.schema.dropTable('picks').execute();
  await db.schema.dropTable('studio_picks').execute();
  await db.schema.dropTable('day_proofs').execute();
  await db.schema.dropTable('client_proof_settings').execute();
}
