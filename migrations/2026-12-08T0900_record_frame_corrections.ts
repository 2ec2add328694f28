import { sql, type Kysely } from 'kysely';

// Frozen in time: this file never imports application code.
export async function up(db: Kysely<any>): Promise<void> {
  // first_frame / last_frame hold the photographer's best numbers, corrected at the station if
  // need be; typed_first_frame / typed_last_frame keep what was typed on the keypad, so a
  // matcher can weigh both. Nullable only so rows written by other code stay valid; every
  // sitting recorded until now gets its typed numbers below.
  await db.schema
    .alterTable('sittings')
    .addColumn('typed_first_frame', 'integer', (col) =>
      col.check(sql`typed_first_frame between 1 and 9999`),
    )
    .addColumn('typed_last_frame', 'integer', (col) =>
      col.check(sql`typed_last_frame between 1 and 9999`),
    )
    .addColumn('frames_corrected_at', 'timestamptz')
    .addColumn('frames_corrected_by_user_id', 'uuid', (col) =>
      col.references('users.id').onDelete('set null'),
    )
    .execute();
  await sql`update sittings set typed_first_frame = first_frame, typed_last_frame = last_frame`.execute(
    db,
  );
  // A corrected sitting always says what was typed before the correction.
  await sql`alter table sittings add constraint sittings_corrected_keeps_typed check (frames_corrected_at is null or typed_first_frame is not null)`.execute(
    db,
  );
}

export async function down(db: Kysely<any>): Promise<void> {
  // Going back keeps the corrected numbers: they are the better ones.
  await db.schema.alterTable('sittings').dropConstraint('sittings_corrected_keeps_typed').execute();
  await db.schema
    .alterTable('sittings')
    .dropColumn('frames_corrected_by_user_id')
    .dropColumn('frames_corrected_at')
    .dropColumn('typed_last_frame')
    .dropColumn('typed_first_frame')
    .execute();
}
