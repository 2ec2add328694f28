import { sql, type Transaction } from 'kysely';
import type { Db } from '../../db/database';
import type { Database } from '../../db/types';

type Executor = Db | Transaction<Database>;

export interface BookingRecord {
  id: string;
  dayId: string;
  clientId: string;
  stationId: string;
  stationName: string;
  personId: string;
  personName: string;
  personEmail: string;
  startsAt: Date;
  status: 'active' | 'cancelled';
  passToken: string;
  calendarUid: string;
  sequence: number;
  preferredName: string | null;
  glasses: boolean;
  accessNeeds: string | null;
  flashSensitive: boolean;
  checkedIn: boolean;
}

function bookingQuery(db: Executor) {
  return db
    .selectFrom('bookings')
    .innerJoin('stations', 'stations.id', 'bookings.stationId')
    .innerJoin('people', 'people.id', 'bookings.personId')
    .select([
      'bookings.id',
      'bookings.dayId',
      'people.clientId',
      'bookings.stationId',
      'stations.name as stationName',
      'bookings.personId',
      sql<string>`coalesce(people.preferred_name, people.given_name) || ' ' || people.family_name`.as(
        'personName',
      ),
      'people.email as personEmail',
      'bookings.startsAt',
      'bookings.status',
      'bookings.passToken',
      'bookings.calendarUid',
      'bookings.sequence',
      'bookings.preferredName',
      'bookings.glasses',
      'bookings.accessNeeds',
      'bookings.flashSensitive',
      // Once the sitter has checked in at the station, the booking is history, not a plan.
      sql<boolean>`exists (select 1 from check_ins where check_ins.booking_id = bookings.id and check_ins.undone_at is null)`.as(
        'checkedIn',
      ),
    ]);
}

export function findBooking(db: Executor, id: string): Promise<BookingRecord | undefined> {
  return bookingQuery(db).where('bookings.id', '=', id).executeTakeFirst();
}

export function activeBookingsOfDay(db: Executor, dayId: string): Promise<BookingRecord[]> {
  return bookingQuery(db)
    .where('bookings.dayId', '=', dayId)
    .where('bookings.status', '=', 'active')
    .orderBy('bookings.startsAt')
    .orderBy('stations.position')
    .execute();
}

export function activeBookingOf(
  db: Executor,
  dayId: string,
  personId: string,
): Promise<BookingRecord | undefined> {
  return bookingQuery(db)
    .where('bookings.dayId', '=', dayId)
    .where('bookings.personId', '=', personId)
    .where('bookings.status', '=', 'active')
    .executeTakeFirst();
}

/**
 * Locks the person and reads their active booking that day, in one round trip. The lock
 * serialises one person's booking changes: a double click becomes two turns, not a race.
 */
export async function lockPersonForDay(
  trx: Transaction<Database>,
  personId: string,
  dayId: string,
) {
  return trx
    .selectFrom('people')
    .leftJoin('bookings', (join) =>
      join
        .onRef('bookings.personId', '=', 'people.id')
        .on('bookings.dayId', '=', dayId)
        .on('bookings.status', '=', 'active'),
    )
    .select([
      'people.id',
      'people.clientId',
      'people.active',
      'bookings.id as bookingId',
      'bookings.startsAt',
    ])
    .where('people.id', '=', personId)
    .forUpdate('people')
    .executeTakeFirst();
}

/**
 * Claims a free seat of the slot in one statement (the caller queues the confirmation). A free
 * station is picked at random so that people claiming the same slot at once rarely aim at the
 * same seat; when two do, the unique index decides and the loser gets null with candidates > 0
 * (try again). candidates = 0 means the slot is full.
 */
export async function claimSeat(
  trx: Transaction<Database>,
  values: {
    dayId: string;
    personId: string;
    startsAt: Date;
    passToken: string;
    calendarUid: string;
    preferredName: string | null;
    glasses: boolean;
    accessNeeds: string | null;
    flashSensitive: boolean;
    bookedByUserId: string | null;
    /** The station staff asked for; null lets the database pick any free one. */
    stationId?: string | null;
  },
): Promise<{ bookingId: string | null; candidates: number }> {
  const result = await sql<{ bookingId: string | null; candidates: string }>`
    with chosen as (
      select stations.id from stations
      where stations.day_id = ${values.dayId}::uuid
        and (${values.stationId ?? null}::uuid is null or stations.id = ${values.stationId ?? null}::uuid)
        and not exists (
          select 1 from bookings
          where bookings.station_id = stations.id
            and bookings.starts_at = ${values.startsAt}::timestamptz
            and bookings.status = 'active')
      order by random()
      limit 1
    ), inserted as (
      insert into bookings (day_id, station_id, person_id, starts_at, pass_token, calendar_uid,
        preferred_name, glasses, access_needs, flash_sensitive, booked_by_user_id)
      select ${values.dayId}::uuid, chosen.id, ${values.personId}::uuid,
        ${values.startsAt}::timestamptz, ${values.passToken}, ${values.calendarUid},
        ${values.preferredName}::text, ${values.glasses}::boolean, ${values.accessNeeds}::text,
        ${values.flashSensitive}::boolean, ${values.bookedByUserId}::uuid
      from chosen
      on conflict do nothing
      returning id
    )
    select (select id from inserted) as "bookingId", (select count(*) from chosen) as candidates
  `.execute(trx);
  const row = result.rows[0];
  return { bookingId: row?.bookingId ?? null, candidates: Number(row?.candidates ?? 0) };
}

export async function lockBooking(trx: Transaction<Database>, id: string) {
  return trx
    .selectFrom('bookings')
    .select(['id', 'status'])
    .where('id', '=', id)
    .forUpdate()
    .executeTakeFirst();
}

/** Stations of the day with no active booking starting at that instant, in station order. */
export async function freeStationsAt(
  db: Executor,
  dayId: string,
  startsAt: Date,
): Promise<string[]> {
  const rows = await db
    .selectFrom('stations')
    .select('stations.id')
    .where('stations.dayId', '=', dayId)
    .where((eb) =>
      eb.not(
        eb.exists(
          eb
            .selectFrom('bookings')
            .select('bookings.id')
            .whereRef('bookings.stationId', '=', 'stations.id')
            .where('bookings.startsAt', '=', startsAt)
            .where('bookings.status', '=', 'active'),
        ),
      ),
    )
    .orderBy('stations.position')
    .execute();
  return rows.map((row) => row.id);
}

export async function moveBooking(
  trx: Transaction<Database>,
  id: string,
  stationId: string,
  startsAt: Date,
  now: Date,
): Promise<void> {
  await trx
    .updateTable('bookings')
    .set((eb) => ({ stationId, startsAt, sequence: eb('sequence', '+', 1), updatedAt: now }))
    .where('id', '=', id)
    .execute();
}

export async function cancelBooking(trx: Transaction<Database>, id: string, now: Date) {
  await trx
    .updateTable('bookings')
    .set((eb) => ({ status: 'cancelled', sequence: eb('sequence', '+', 1), updatedAt: now }))
    .where('id', '=', id)
    .execute();
}

/** The answers given at booking (what helps on the day), as the sitter corrects them. */
export async function updateSittingNeeds(
  trx: Transaction<Database>,
  id: string,
  needs: {
    preferredName: string | null;
    glasses: boolean;
    accessNeeds: string | null;
    flashSensitive: boolean;
  },
  now: Date,
) {
  await trx
    .updateTable('bookings')
    .set({ ...needs, updatedAt: now })
    .where('id', '=', id)
    .execute();
}

/** Active bookings per slot start, for showing free seats. */
export async function takenSeatsByStart(db: Executor, dayId: string): Promise<Map<string, number>> {
  const rows = await db
    .selectFrom('bookings')
    .select(['startsAt', db.fn.countAll<string>().as('n')])
    .where('dayId', '=', dayId)
    .where('status', '=', 'active')
    .groupBy('startsAt')
    .execute();
  return new Map(rows.map((row) => [new Date(row.startsAt).toISOString(), Number(row.n)]));
}

/** The stations holding an active booking at each slot start, for naming the free ones. */
export async function takenStationsByStart(
  db: Executor,
  dayId: string,
): Promise<Map<string, Set<string>>> {
  const rows = await db
    .selectFrom('bookings')
    .select(['startsAt', 'stationId'])
    .where('dayId', '=', dayId)
    .where('status', '=', 'active')
    .execute();
  const taken = new Map<string, Set<string>>();
  for (const row of rows) {
    const key = new Date(row.startsAt).toISOString();
    const stations = taken.get(key) ?? new Set<string>();
    stations.add(row.stationId);
    taken.set(key, stations);
  }
  return taken;
}

export async function confirmedDaysOfClient(db: Executor, clientId: string): Promise<string[]> {
  const rows = await db
    .selectFrom('shootDays')
    .select('id')
    .where('clientId', '=', clientId)
    .where('status', '=', 'confirmed')
    .execute();
  return rows.map((row) => row.id);
}
