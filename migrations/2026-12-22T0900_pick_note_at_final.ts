import { sql, type Kysely } from 'kysely';

/**
 * The sitter's note as it was when the final was sent back, so the retouch queue can say when
 * the note changed afterwards (the final may no longer do what it asks). Finals sent before
 * this migration count as made with the note they have now; a final set aside before it, if
 * chosen again with a note, is shown for a second look (what note it was made with is unknown).
 */
export async function up(db: Kysely<any>): Promise<void> {
  await sql`alter table picks add column note_at_final text`.execute(db);
  await sql`alter table set_aside_finals add column note_at_final text`.execute(db);
  await sql`update picks set note_at_final = note where final_key is not null`.execute(db);
}

export async function down(db: Kysely<any>): Promise<void> {
  await sql`alter table set_aside_finals drop column note_at_final`.execute(db);
  await sql`alter table picks drop column note_at_final`.execute(db);
}
