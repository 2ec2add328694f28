import type { Kysely } from 'kysely';

/**
 * Failed sign-ins per client address and account pair: a growing wait for that pair only, so
 * an attacker slows themselves down without locking the account's owner out.
 */
export async function up(db: Kysely<any>): Promise<void> {
  await db.schema
    .createTable('sign_in_backoff')
    // A hash of the action, the address and the e-mail: no address book of attempts is kept.
    .addColumn('key', 'text', (col) => col.primaryKey())
    .addColumn('attempts', 'integer', (col) => col.notNull())
    .addColumn('last_attempt_at', 'timestamptz', (col) => col.notNull())
    .addColumn('next_allowed_at', 'timestamptz')
    .execute();
}

export async function down(db: Kysely<any>): Promise<void> {
  await db.schema.dropTable('sign_in_backoff').execute();
}
