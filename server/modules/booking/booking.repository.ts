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

/** Serialises one person's booking changes (a double click becomes two turns, not a race). */
export async function lockPerson(trx: Transaction<Database>, personId: string) {
  return trx
    .selectFrom('people')
    .select(['id', 'clientId', 'active'])
    .where('id', '=', personId)
    .forUpdate()
    .executeTakeFirst();
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

/**
 * Claims one seat. The unique indexes decide under concurrency: when another transaction took
 * the seat (or this person already holds a booking that day) nothing is inserted and null comes
 * back, without aborting the surrounding transaction.
 */
export async function insertBookingIfFree(
  trx: Transaction<Database>,
  values: {
    dayId: string;
    stationId: string;
    personId: string;
    startsAt: Date;
    passToken: string;
    calendarUid: string;
    preferredName: string | null;
    glasses: boolean;
    accessNeeds: string | null;
    flashSensitive: boolean;
    bookedByUserId: string | null;
  },
): Promise<string | null> {
  const row = await trx
    .insertInto('bookings')
    .values(values)
    .onConflict((conflict) => conflict.doNothing())
    .returning('id')
    .executeTakeFirst();
  return row?.id ?? null;
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

export async function confirmedDaysOfClient(db: Executor, clientId: string): Promise<string[]> {
  const rows = await db
    .selectFrom('shootDays')
    .select('id')
    .where('clientId', '=', clientId)
    .where('status', '=', 'confirmed')
    .execute();
  return rows.map((row) => row.id);
}
