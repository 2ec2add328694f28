import { sql, type Kysely } from 'kysely';

// Frozen in time: this file never imports application code.
export async function up(db: Kysely<any>): Promise<void> {
  // One card per station: the lighting and camera plan that keeps every station's light the same.
  await db.schema
    .createTable('setup_cards')
    .addColumn('station_id', 'uuid', (col) =>
      col.primaryKey().references('stations.id').onDelete('cascade'),
    )
    .addColumn('card', 'jsonb', (col) => col.notNull())
    .addColumn('updated_at', 'timestamptz', (col) => col.notNull().defaultTo(sql`now()`))
    .addColumn('updated_by_user_id', 'uuid', (col) =>
      col.references('users.id').onDelete('set null'),
    )
    .execute();
}

export async function down(db: Kysely<any>): Promise<void> {
  await db.schema.dropTable('setup_cards').execute();
}
