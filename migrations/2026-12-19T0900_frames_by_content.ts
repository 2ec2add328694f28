import { sql, type Kysely } from 'kysely';

/** A day's frames looked up by their bytes alone (an upload of a file the day already has). */
export async function up(db: Kysely<any>): Promise<void> {
  await sql`create index frames_day_content on frames (day_id, content_sha256)`.execute(db);
}

export async function down(db: Kysely<any>): Promise<void> {
  await sql`drop index frames_day_content`.execute(db);
}
