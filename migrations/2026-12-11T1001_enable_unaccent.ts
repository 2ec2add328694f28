import { sql, type Kysely } from 'kysely';

// Frozen in time: this file never imports application code.
export async function up(db: Kysely<any>): Promise<void> {
  // The console's name search ignores accents ("Zoe" finds Zoë). unaccent ships with
  // PostgreSQL's contrib modules and is a trusted extension, so a database owner may add it.
  await sql`create extension if not exists unaccent`.execute(db);
}

export async function down(db: Kysely<any>): Promise<void> {
  await sql`drop extension if exists unaccent`.execute(db);
}
