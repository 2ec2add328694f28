import { sql, type Kysely } from 'kysely';

/** A price in the currency's minor unit (pence, cents): at most 1,000,000.00 in a two-digit currency. */
const price = (name: string) => sql.raw(`${name} between 0 and 100000000`);

// Frozen in time: this file never imports application code.
export async function up(db: Kysely<any>): Promise<void> {
  // What the studio charges a client. Amounts are integers in the currency's minor unit; the
  // tax rate is in basis points (20% = 2000).
  await db.schema
    .createTable('price_lists')
    .addColumn('client_id', 'uuid', (col) =>
      col.primaryKey().references('clients.id').onDelete('cascade'),
    )
    // ISO 4217 alphabetic code.
    .addColumn('currency', 'text', (col) => col.notNull().check(sql`currency ~ '^[A-Z]{3}$'`))
    .addColumn('day_rate_minor', 'integer', (col) => col.notNull().check(price('day_rate_minor')))
    .addColumn('per_station_minor', 'integer', (col) =>
      col.notNull().check(price('per_station_minor')),
    )
    .addColumn('per_person_minor', 'integer', (col) =>
      col.notNull().check(price('per_person_minor')),
    )
    .addColumn('per_extra_pick_minor', 'integer', (col) =>
      col.notNull().check(price('per_extra_pick_minor')),
    )
    .addColumn('per_retouch_minor', 'integer', (col) =>
      col.notNull().check(price('per_retouch_minor')),
    )
    .addColumn('per_extra_rendition_minor', 'integer', (col) =>
      col.notNull().check(price('per_extra_rendition_minor')),
    )
    // Renditions each photographed person gets without charge; the rest are extra.
    .addColumn('renditions_included', 'integer', (col) =>
      col
        .notNull()
        .defaultTo(0)
        .check(sql`renditions_included between 0 and 50`),
    )
    .addColumn('tax_rate_basis_points', 'integer', (col) =>
      col.notNull().check(sql`tax_rate_basis_points between 0 and 10000`),
    )
    .addColumn('updated_by_user_id', 'uuid', (col) =>
      col.references('users.id').onDelete('set null'),
    )
    .addColumn('updated_at', 'timestamptz', (col) => col.notNull().defaultTo(sql`now()`))
    .execute();

  // The last number given out per year: the upsert that takes the next one locks the year's
  // row, so numbers never repeat and have no gaps from racing issuers.
  await db.schema
    .createTable('invoice_sequences')
    .addColumn('year', 'integer', (col) => col.primaryKey())
    .addColumn('last_number', 'integer', (col) => col.notNull().check(sql`last_number > 0`))
    .execute();

  // An issued invoice: its number and everything printed on it, kept as it was issued, so
  // printing it again gives the same invoice whatever changes later.
  await db.schema
    .createTable('invoices')
    .addColumn('id', 'uuid', (col) => col.primaryKey().defaultTo(sql`gen_random_uuid()`))
    .addColumn('number', 'text', (col) =>
      col
        .notNull()
        .unique()
        .check(sql`number ~ '^LK-[0-9]{4}-[0-9]{4,}$'`),
    )
    .addColumn('year', 'integer', (col) => col.notNull())
    .addColumn('sequence', 'integer', (col) => col.notNull().check(sql`sequence > 0`))
    .addColumn('client_id', 'uuid', (col) =>
      col.notNull().references('clients.id').onDelete('restrict'),
    )
    .addColumn('day_id', 'uuid', (col) =>
      col.notNull().unique().references('shoot_days.id').onDelete('restrict'),
    )
    .addColumn('currency', 'text', (col) => col.notNull().check(sql`currency ~ '^[A-Z]{3}$'`))
    .addColumn('subtotal_minor', 'bigint', (col) => col.notNull())
    .addColumn('tax_minor', 'bigint', (col) => col.notNull())
    .addColumn('total_minor', 'bigint', (col) => col.notNull())
    .addColumn('snapshot', 'jsonb', (col) => col.notNull())
    .addColumn('issued_at', 'timestamptz', (col) => col.notNull())
    // No "set null": that would be an update, which the trigger below refuses.
    .addColumn('issued_by_user_id', 'uuid', (col) => col.references('users.id'))
    .addUniqueConstraint('invoices_year_sequence', ['year', 'sequence'])
    .addCheckConstraint('invoices_total_adds_up', sql`total_minor = subtotal_minor + tax_minor`)
    .execute();
  await sql`create index invoices_client on invoices (client_id, issued_at)`.execute(db);

  // Issued once and never changed: the database refuses an update, not only the code.
  await sql`create function invoices_never_change() returns trigger language plpgsql as $$
    begin
      raise exception 'an issued invoice is never changed' using errcode = 'check_violation';
    end $$`.execute(db);
  await sql`create trigger invoices_never_change before update on invoices
    for each row execute function invoices_never_change()`.execute(db);
}

export async function down(db: Kysely<any>): Promise<void> {
  await sql`drop trigger invoices_never_change on invoices`.execute(db);
  await sql`drop function invoices_never_change()`.execute(db);
  await db.schema.dropTable('invoices').execute();
  await db.schema.dropTable('invoice_sequences').execute();
  await db.schema.dropTable('price_lists').execute();
}
