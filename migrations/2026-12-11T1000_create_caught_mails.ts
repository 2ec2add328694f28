import { sql, type Kysely } from 'kysely';

// Frozen in time: this file never imports application code.
export async function up(db: Kysely<any>): Promise<void> {
  // What the local mail catcher received (development only), kept so the Mailbox survives a
  // restart of `npm start`. Attachments keep their bytes base64-encoded in a JSON array.
  await db.schema
    .createTable('caught_mails')
    .addColumn('id', 'uuid', (col) => col.primaryKey())
    .addColumn('received_at', 'timestamptz', (col) => col.notNull().defaultTo(sql`now()`))
    .addColumn('from_text', 'text', (col) => col.notNull())
    .addColumn('reply_to', 'text', (col) => col.notNull().defaultTo(''))
    .addColumn('to_addresses', sql`text[]`, (col) => col.notNull())
    .addColumn('subject', 'text', (col) => col.notNull())
    .addColumn('text_body', 'text', (col) => col.notNull())
    .addColumn('html_body', 'text', (col) => col.notNull())
    .addColumn('attachments', 'jsonb', (col) => col.notNull().defaultTo(sql`'[]'::jsonb`))
    .execute();
  await db.schema
    .createIndex('caught_mails_newest_first')
    .on('caught_mails')
    .columns(['received_at desc', 'id'])
    .execute();
}

export async function down(db: Kysely<any>): Promise<void> {
  await db.schema.dropTable('caught_mails').execute();
}
