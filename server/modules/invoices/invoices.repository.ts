import { sql, type Transaction } from 'kysely';
import type { Db } from '../../db/database';
import type { Database } from '../../db/types';
import type { DayCounts, InvoiceSnapshot, OfficeFigures, PriceList } from '../../schemas/invoices';
import { invitedPeopleQuery, type DayRecord } from '../days/days.repository';

type Executor = Db | Transaction<Database>;
type Day = Pick<DayRecord, 'id' | 'clientId' | 'officeId' | 'inviteBy' | 'inviteDepartments'>;

/**
 * The people the day invited, as a subquery. Someone added to the roster at a station that day
 * (a walk-in who was not on it) joined the roster, but was not invited.
 */
function invitedIds(db: Executor, day: Day) {
  return invitedPeopleQuery(db, day)
    .clearSelect()
    .select(['people.id', 'people.officeId'])
    .where((eb) =>
      eb.or([eb('people.addedOnDayId', 'is', null), eb('people.addedOnDayId', '!=', day.id)]),
    );
}

/** The delivery feature's table, once its migration has run. */
async function deliveredRenditionsTableExists(db: Executor): Promise<boolean> {
  const { rows } = await sql<{
    present: boolean;
  }>`select to_regclass('delivered_renditions') is not null as present`.execute(db);
  return rows[0]?.present ?? false;
}

/** Renditions delivered for the day; 0 while the delivery feature's table does not exist. */
export async function renditionsDelivered(db: Executor, dayId: string): Promise<number> {
  if (!(await deliveredRenditionsTableExists(db))) return 0;
  const { rows } = await sql<{ count: number }>`
    select count(*)::int as count from delivered_renditions where day_id = ${dayId}`.execute(db);
  return rows[0]?.count ?? 0;
}

/** Renditions beyond `included` per person, person by person; 0 without the table. */
export async function extraRenditions(
  db: Executor,
  dayId: string,
  included: number,
): Promise<number> {
  if (!(await deliveredRenditionsTableExists(db))) return 0;
  const { rows } = await sql<{ extra: number }>`
    select coalesce(sum(greatest(per_person.count - ${included}, 0)), 0)::int as extra
    from (select count(*) as count from delivered_renditions where day_id = ${dayId}
          group by person_id) as per_person`.execute(db);
  return rows[0]?.extra ?? 0;
}

/** Every figure of the day but the renditions, in one round trip. */
async function recordCounts(db: Executor, day: Day) {
  const { rows } = await sql<Omit<DayCounts, 'renditionsDelivered' | 'extraRenditions'>>`
    with invited as (${invitedIds(db, day)}),
    shot as (select distinct person_id from sittings where day_id = ${day.id} and undone_at is null),
    picked as (select person_id, count(*) as count from picks where day_id = ${day.id} group by person_id)
    select
      (select count(*) from invited)::int as "invited",
      (select count(distinct person_id) from bookings
        where day_id = ${day.id} and status = 'active')::int as "booked",
      (select count(distinct person_id) from check_ins
        where day_id = ${day.id} and undone_at is null)::int as "checkedIn",
      (select count(*) from check_ins where day_id = ${day.id} and undone_at is null
        and method in ('walk_in', 'new_person'))::int as "walkIns",
      (select count(*) from shot)::int as "photographed",
      (select count(*) from no_shows where day_id = ${day.id} and undone_at is null)::int as "noShows",
      (select count(*) from invited
        where invited.id not in (select person_id from shot))::int as "missed",
      (select coalesce(sum(count), 0) from picked)::int as "picks",
      (select coalesce(sum(greatest(picked.count - included.picks, 0)), 0) from picked,
        (select coalesce((select picks_included from client_proof_settings
          where client_id = ${day.clientId}), 1) as picks) as included)::int as "extraPicks",
      (select count(*) from picks where day_id = ${day.id} and final_key is not null)::int
        as "retouchesDone",
      (select count(*) from stations where day_id = ${day.id})::int as "stations"`.execute(db);
  const counts = rows[0];
  if (!counts) throw new Error('The counts query returned no row.');
  return counts;
}

export async function dayCounts(
  db: Executor,
  day: Day,
  renditionsIncluded: number,
): Promise<DayCounts> {
  const [counts, delivered, extra] = await Promise.all([
    recordCounts(db, day),
    renditionsDelivered(db, day.id),
    extraRenditions(db, day.id, renditionsIncluded),
  ]);
  return { ...counts, renditionsDelivered: delivered, extraRenditions: extra };
}

/** Invited, booked and photographed per office of the people (their roster office). */
export async function officeFigures(db: Executor, day: Day): Promise<OfficeFigures[]> {
  const { rows } = await sql<OfficeFigures>`
    with invited as (${invitedIds(db, day)}),
    booked as (select distinct person_id as id from bookings
      where day_id = ${day.id} and status = 'active'),
    shot as (select distinct person_id as id from sittings
      where day_id = ${day.id} and undone_at is null),
    everyone as (select id from invited union select id from booked union select id from shot)
    select coalesce(offices.name, 'No office') as "label",
      count(*) filter (where everyone.id in (select id from invited))::int as "invited",
      count(*) filter (where everyone.id in (select id from booked))::int as "booked",
      count(*) filter (where everyone.id in (select id from shot))::int as "photographed"
    from everyone
    join people on people.id = everyone.id
    left join offices on offices.id = people.office_id
    group by 1 order by 1`.execute(db);
  return rows;
}

const priceColumns = [
  'currency',
  'dayRateMinor',
  'perStationMinor',
  'perPersonMinor',
  'perExtraPickMinor',
  'perRetouchMinor',
  'perExtraRenditionMinor',
  'renditionsIncluded',
  'taxRateBasisPoints',
] as const;

export async function findPriceList(db: Executor, clientId: string) {
  return db
    .selectFrom('priceLists')
    .select([...priceColumns, 'updatedAt'])
    .where('clientId', '=', clientId)
    .executeTakeFirst();
}

export async function savePriceList(
  trx: Transaction<Database>,
  clientId: string,
  prices: PriceList,
  userId: string,
) {
  const values = { ...prices, updatedByUserId: userId, updatedAt: new Date() };
  return trx
    .insertInto('priceLists')
    .values({ clientId, ...values })
    .onConflict((oc) => oc.column('clientId').doUpdateSet(values))
    .returning('updatedAt')
    .executeTakeFirstOrThrow();
}

/** The package's price per extra pick (0 unless set): what a new price list starts from. */
export async function packagePrice(db: Executor, clientId: string): Promise<number> {
  const row = await db
    .selectFrom('clientProofSettings')
    .select('extraPickPriceCents')
    .where('clientId', '=', clientId)
    .executeTakeFirst();
  return row?.extraPickPriceCents ?? 0;
}

const invoiceColumns = ['id', 'number', 'clientId', 'dayId', 'snapshot', 'issuedAt'] as const;

export async function findInvoice(db: Executor, id: string) {
  const row = await db
    .selectFrom('invoices')
    .select(invoiceColumns)
    .where('id', '=', id)
    .executeTakeFirst();
  return row && { ...row, snapshot: row.snapshot as InvoiceSnapshot };
}

export async function invoiceRefs(db: Executor, dayIds: string[]) {
  if (dayIds.length === 0) return [];
  return db
    .selectFrom('invoices')
    .select(['id', 'number', 'issuedAt', 'dayId'])
    .where('dayId', 'in', dayIds)
    .execute();
}

/** The year's next number; the upsert holds the year's row locked until the transaction ends. */
export async function takeInvoiceSequence(trx: Transaction<Database>, year: number) {
  const row = await trx
    .insertInto('invoiceSequences')
    .values({ year, lastNumber: 1 })
    .onConflict((oc) =>
      oc.column('year').doUpdateSet({ lastNumber: sql`invoice_sequences.last_number + 1` }),
    )
    .returning('lastNumber')
    .executeTakeFirstOrThrow();
  return row.lastNumber;
}

export async function insertInvoice(
  trx: Transaction<Database>,
  invoice: {
    number: string;
    year: number;
    sequence: number;
    clientId: string;
    dayId: string;
    snapshot: InvoiceSnapshot;
    issuedAt: Date;
    issuedByUserId: string;
  },
) {
  return trx
    .insertInto('invoices')
    .values({
      ...invoice,
      currency: invoice.snapshot.currency,
      subtotalMinor: invoice.snapshot.subtotalMinor,
      taxMinor: invoice.snapshot.taxMinor,
      totalMinor: invoice.snapshot.totalMinor,
      snapshot: JSON.stringify(invoice.snapshot),
    })
    .returning('id')
    .executeTakeFirstOrThrow();
}
