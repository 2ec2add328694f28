import { sql, type Kysely } from 'kysely';

// Frozen in time: this file never imports application code.
export async function up(db: Kysely<any>): Promise<void> {
  // One row per resumable upload (the tus upload id), created before the first byte arrives,
  // so a resumed PATCH can be checked against who started it and for which day and station.
  await db.schema
    .createTable('frame_uploads')
    .addColumn('id', 'text', (col) => col.primaryKey())
    .addColumn('day_id', 'uuid', (col) =>
      col.notNull().references('shoot_days.id').onDelete('cascade'),
    )
    .addColumn('station_id', 'uuid', (col) =>
      col.notNull().references('stations.id').onDelete('cascade'),
    )
    .addColumn('user_id', 'uuid', (col) => col.references('users.id').onDelete('set null'))
    .addColumn('card_path', 'text', (col) => col.notNull())
    .addColumn('declared_size', 'bigint', (col) => col.notNull())
    .addColumn('declared_sha256', 'text')
    .addColumn('status', 'text', (col) =>
      col
        .notNull()
        .defaultTo('receiving')
        .check(sql`status in ('receiving', 'stored', 'duplicate', 'refused')`),
    )
    .addColumn('refusal', 'text')
    .addColumn('frame_id', 'uuid')
    .addColumn('created_at', 'timestamptz', (col) => col.notNull().defaultTo(sql`now()`))
    .addColumn('finished_at', 'timestamptz')
    .execute();
  await sql`create index frame_uploads_day on frame_uploads (day_id, created_at)`.execute(db);

  await db.schema
    .createTable('frames')
    .addColumn('id', 'uuid', (col) => col.primaryKey())
    .addColumn('day_id', 'uuid', (col) =>
      col.notNull().references('shoot_days.id').onDelete('cascade'),
    )
    .addColumn('station_id', 'uuid', (col) =>
      col.notNull().references('stations.id').onDelete('cascade'),
    )
    .addColumn('uploaded_by_user_id', 'uuid', (col) =>
      col.references('users.id').onDelete('set null'),
    )
    .addColumn('card_path', 'text', (col) => col.notNull())
    .addColumn('content_sha256', 'text', (col) =>
      col.notNull().check(sql`content_sha256 ~ '^[0-9a-f]{64}$'`),
    )
    .addColumn('byte_size', 'bigint', (col) => col.notNull())
    .addColumn('format', 'text', (col) =>
      col.notNull().check(sql`format in ('jpeg', 'heif', 'raw')`),
    )
    .addColumn('original_key', 'text', (col) => col.notNull())
    .addColumn('preview_key', 'text')
    .addColumn('thumbnail_key', 'text')
    .addColumn('no_preview', 'boolean', (col) => col.notNull().defaultTo(false))
    // DCF folder 100-999 and file number 0001-9999 (JEITA CP-3461), null when the name is not DCF.
    .addColumn('dcf_folder', 'integer', (col) => col.check(sql`dcf_folder between 100 and 999`))
    .addColumn('dcf_number', 'integer', (col) => col.check(sql`dcf_number between 1 and 9999`))
    .addColumn('dcf_stem', 'text')
    .addColumn('camera_serial', 'text')
    .addColumn('camera_make', 'text')
    .addColumn('camera_model', 'text')
    // The camera's own unzoned wall clock, kept as it was written (Exif DateTimeOriginal plus
    // SubSecTimeOriginal); the offset only when the camera wrote OffsetTimeOriginal.
    .addColumn('captured_local', sql`timestamp(3) without time zone`)
    .addColumn('capture_offset', 'text', (col) =>
      col.check(sql`capture_offset ~ '^[+-][0-9]{2}:[0-9]{2}$'`),
    )
    .addColumn('orientation', 'integer', (col) => col.check(sql`orientation between 1 and 8`))
    .addColumn('pixel_width', 'integer')
    .addColumn('pixel_height', 'integer')
    .addColumn('slate_token', 'text')
    // A raw file and the JPEG of the same name and number are one frame in two formats: the
    // raw row points at its JPEG, and the JPEG is the one that is matched and shown.
    .addColumn('paired_with_frame_id', 'uuid', (col) =>
      col.references('frames.id').onDelete('set null'),
    )
    .addColumn('ingest_status', 'text', (col) =>
      col
        .notNull()
        .defaultTo('waiting')
        .check(sql`ingest_status in ('waiting', 'reading', 'read', 'failed')`),
    )
    .addColumn('ingest_error', 'text')
    .addColumn('uploaded_at', 'timestamptz', (col) => col.notNull().defaultTo(sql`now()`))
    .addColumn('read_at', 'timestamptz')
    .execute();
  // The same file from the same card path is one frame, however often it is uploaded.
  await sql`create unique index frames_one_per_card_file on frames (day_id, card_path, content_sha256)`.execute(
    db,
  );
  await sql`create index frames_day_station on frames (day_id, station_id, dcf_folder, dcf_number)`.execute(
    db,
  );
  await sql`create index frames_slate on frames (slate_token) where slate_token is not null`.execute(
    db,
  );
}

export async function down(db: Kysely<any>): Promise<void> {
  await db.schema.dropTable('frames').execute();
  await db.schema.dropTable('frame_uploads').execute();
}
