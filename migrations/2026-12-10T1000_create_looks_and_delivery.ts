import { sql, type Kysely } from 'kysely';

// Frozen in time: this file never imports application code.
export async function up(db: Kysely<any>): Promise<void> {
  // A client's look: its renditions (see server/schemas/looks.ts), and how files are named.
  await db.schema
    .createTable('client_looks')
    .addColumn('client_id', 'uuid', (col) =>
      col.primaryKey().references('clients.id').onDelete('cascade'),
    )
    .addColumn('name', 'text', (col) => col.notNull())
    .addColumn('renditions', 'jsonb', (col) => col.notNull())
    .addColumn('file_name_template', 'text', (col) =>
      col.notNull().defaultTo('{employee_id}_{family}_{given}_{rendition}'),
    )
    // Bumped on every change, so renditions made from an older look are known to be stale.
    .addColumn('version', 'integer', (col) => col.notNull().defaultTo(1))
    .addColumn('updated_by_user_id', 'uuid', (col) =>
      col.references('users.id').onDelete('set null'),
    )
    .addColumn('updated_at', 'timestamptz', (col) => col.notNull().defaultTo(sql`now()`))
    .execute();

  // Where the eyes are in the image a pick is delivered from (its final, else its original),
  // in that image's upright pixels. A person's marks win over detection.
  await db.schema
    .createTable('portrait_eyes')
    .addColumn('pick_id', 'uuid', (col) =>
      col.primaryKey().references('picks.id').onDelete('cascade'),
    )
    .addColumn('source_key', 'text', (col) => col.notNull())
    .addColumn('status', 'text', (col) =>
      col
        .notNull()
        .check(sql`status in ('found', 'no_face', 'several_faces', 'low_confidence', 'marked')`),
    )
    .addColumn('left_x', 'real')
    .addColumn('left_y', 'real')
    .addColumn('right_x', 'real')
    .addColumn('right_y', 'real')
    .addColumn('roll_deg', 'real')
    .addColumn('confidence', 'real', (col) => col.notNull().defaultTo(0))
    .addColumn('image_width', 'integer', (col) => col.notNull())
    .addColumn('image_height', 'integer', (col) => col.notNull())
    .addColumn('marked_by_user_id', 'uuid', (col) =>
      col.references('users.id').onDelete('set null'),
    )
    .addColumn('updated_at', 'timestamptz', (col) => col.notNull().defaultTo(sql`now()`))
    .addCheckConstraint(
      'portrait_eyes_both_or_none',
      sql`(left_x is null) = (right_x is null) and (left_x is null) = (status not in ('found', 'marked'))`,
    )
    .execute();

  // Each rendition rendered for a pick, from which source and which look version.
  await db.schema
    .createTable('portrait_renditions')
    .addColumn('pick_id', 'uuid', (col) => col.notNull().references('picks.id').onDelete('cascade'))
    .addColumn('rendition_name', 'text', (col) => col.notNull())
    .addColumn('status', 'text', (col) =>
      col.notNull().check(sql`status in ('rendered', 'refused')`),
    )
    .addColumn('refusal', 'text')
    .addColumn('key', 'text')
    .addColumn('byte_size', 'bigint')
    .addColumn('sha256', 'text')
    .addColumn('width', 'integer')
    .addColumn('height', 'integer')
    .addColumn('source_key', 'text', (col) => col.notNull())
    .addColumn('look_version', 'integer', (col) => col.notNull())
    .addColumn('rendered_at', 'timestamptz', (col) => col.notNull().defaultTo(sql`now()`))
    .addPrimaryKeyConstraint('portrait_renditions_pk', ['pick_id', 'rendition_name'])
    .execute();

  // A released set, one row per release of a day (a re-release after a correction is the next).
  await db.schema
    .createTable('deliveries')
    .addColumn('id', 'uuid', (col) => col.primaryKey())
    .addColumn('day_id', 'uuid', (col) =>
      col.notNull().references('shoot_days.id').onDelete('cascade'),
    )
    .addColumn('release', 'integer', (col) => col.notNull())
    .addColumn('released_by_user_id', 'uuid', (col) =>
      col.references('users.id').onDelete('set null'),
    )
    .addColumn('released_at', 'timestamptz', (col) => col.notNull().defaultTo(sql`now()`))
    .addColumn('files', 'integer', (col) => col.notNull())
    .addColumn('changed', 'integer', (col) => col.notNull())
    .addUniqueConstraint('deliveries_one_number', ['day_id', 'release'])
    .execute();

  // The current set of a day: what HR downloads and the summary counts.
  await db.schema
    .createTable('delivered_renditions')
    .addColumn('id', 'uuid', (col) => col.primaryKey())
    .addColumn('day_id', 'uuid', (col) =>
      col.notNull().references('shoot_days.id').onDelete('cascade'),
    )
    .addColumn('delivery_id', 'uuid', (col) =>
      col.notNull().references('deliveries.id').onDelete('cascade'),
    )
    .addColumn('person_id', 'uuid', (col) =>
      col.notNull().references('people.id').onDelete('cascade'),
    )
    .addColumn('pick_id', 'uuid', (col) => col.notNull().references('picks.id').onDelete('cascade'))
    .addColumn('rendition_name', 'text', (col) => col.notNull())
    .addColumn('file_name', 'text', (col) => col.notNull())
    .addColumn('key', 'text', (col) => col.notNull())
    .addColumn('byte_size', 'bigint', (col) => col.notNull())
    .addColumn('sha256', 'text', (col) => col.notNull())
    // Changed since the release before (new, or different bytes).
    .addColumn('changed', 'boolean', (col) => col.notNull())
    .addUniqueConstraint('delivered_renditions_one_name', ['day_id', 'file_name'])
    .execute();

  // A sitter's personal download link: signed by its random token, expiring, revocable.
  await db.schema
    .createTable('sitter_download_links')
    .addColumn('id', 'uuid', (col) => col.primaryKey())
    .addColumn('day_id', 'uuid', (col) =>
      col.notNull().references('shoot_days.id').onDelete('cascade'),
    )
    .addColumn('person_id', 'uuid', (col) =>
      col.notNull().references('people.id').onDelete('cascade'),
    )
    .addColumn('token_hash', 'text', (col) => col.notNull().unique())
    .addColumn('expires_at', 'timestamptz', (col) => col.notNull())
    .addColumn('revoked_at', 'timestamptz')
    .addColumn('created_at', 'timestamptz', (col) => col.notNull().defaultTo(sql`now()`))
    .execute();

  await sql`alter table day_mailings drop constraint day_mailings_kind_check`.execute(db);
  await sql`alter table day_mailings add constraint day_mailings_kind_check
    check (kind in ('invitation', 'reminder', 'day_before', 'proofs', 'proofs_reminder', 'portraits_ready'))`.execute(
    db,
  );
}

export async function down(db: Kysely<any>): Promise<void> {
  await sql`delete from day_mailings where kind = 'portraits_ready'`.execute(db);
  await sql`alter table day_mailings drop constraint day_mailings_kind_check`.execute(db);
  await sql`alter table day_mailings add constraint day_mailings_kind_check
    check (kind in ('invitation', 'reminder', 'day_before', 'proofs', 'proofs_reminder'))`.execute(
    db,
  );
  for (const table of [
    'sitter_download_links',
    'delivered_renditions',
    'deliveries',
    'portrait_renditions',
    'portrait_eyes',
    'client_looks',
  ]) {
    await db.schema.dropTable(table).execute();
  }
}
