import { sql, type Kysely } from 'kysely';

/**
 * A retouched final whose pick the sitter let go (choosing another portrait), kept by person
 * and frame: if they choose that frame again, the final comes back with it instead of the
 * retouch being done twice. The stored file is not deleted when a pick goes.
 */
export async function up(db: Kysely<any>): Promise<void> {
  await db.schema
    .createTable('set_aside_finals')
    .addColumn('day_id', 'uuid', (col) =>
      col.notNull().references('shoot_days.id').onDelete('cascade'),
    )
    .addColumn('person_id', 'uuid', (col) =>
      col.notNull().references('people.id').onDelete('cascade'),
    )
    .addColumn('frame_id', 'uuid', (col) =>
      col.notNull().references('frames.id').onDelete('cascade'),
    )
    .addColumn('final_key', 'text', (col) => col.notNull())
    .addColumn('final_file_name', 'text')
    .addColumn('final_byte_size', 'bigint')
    .addColumn('final_uploaded_at', 'timestamptz')
    .addColumn('final_uploaded_by_user_id', 'uuid', (col) =>
      col.references('users.id').onDelete('set null'),
    )
    .addColumn('retouch_user_id', 'uuid', (col) => col.references('users.id').onDelete('set null'))
    .addColumn('set_aside_at', 'timestamptz', (col) => col.notNull().defaultTo(sql`now()`))
    .addPrimaryKeyConstraint('set_aside_finals_pk', ['day_id', 'person_id', 'frame_id'])
    .execute();
}

export async function down(db: Kysely<any>): Promise<void> {
  await db.schema.dropTable('set_aside_finals').execute();
}
