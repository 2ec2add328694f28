import { sql, type Transaction } from 'kysely';
import type { Db } from '../../db/database';
import type { Database } from '../../db/types';
import { addJobExpression } from '../../jobs/job-queue';
import { personIsInvited } from '../days/days.repository';

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

export type ClaimOutcome =
  | { kind: 'booked'; booking: BookingRecord }
  | { kind: 'day_changed' }
  | { kind: 'no_person' }
  | { kind: 'has_booking'; bookingId: string; startsAt: Date }
  | { kind: 'seat_lost' }
  | { kind: 'full' };

/**
 * A booking claimed in one statement, the whole rule in one round trip:
 * - the day row under a shared lock (a day edit locks it for update, so it cannot change the
 *   day between the request's checks and this insert), still confirmed and still the version
 *   the request checked (xmin: any update of the row makes a new one);
 * - the person under a row lock, if the day invites them (so one person's claims take turns),
 *   and their active booking that day if they have one;
 * - a free station of the slot, picked at random so that people claiming the same slot at
 *   once rarely aim at the same seat (or the one staff asked for);
 * - the insert, with the unique indexes (one booking per seat, one per sitter and day)
 *   deciding any race: a lost one inserts nothing;
 * - the confirmation mail queued with the booking (an outbox), for the worker to render.
 */
export async function claimBooking(
  db: Executor,
  values: {
    dayId: string;
    clientId: string;
    /** The day row's version (xmin) the request's checks were made on. */
    dayVersion: string;
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
    stationId: string | null;
    mailTask: string;
  },
): Promise<ClaimOutcome> {
  const result = await sql<{
    dayHolds: boolean;
    personFound: boolean;
    existingId: string | null;
    existingStartsAt: Date | null;
    candidates: number;
    id: string | null;
    stationId: string;
    stationName: string;
    personName: string;
    personEmail: string;
    sequence: number;
  }>`
    with day as (
      select shoot_days.id from shoot_days
      where shoot_days.id = ${values.dayId}::uuid
        and shoot_days.status = 'confirmed'
        and shoot_days.xmin::text = ${values.dayVersion}
      for share
    ), person as (
      select people.id, people.email,
        coalesce(people.preferred_name, people.given_name) || ' ' || people.family_name as name
      from people
      where people.id = ${values.personId}::uuid
        and exists (
          select 1 from shoot_days
          where shoot_days.id = ${values.dayId}::uuid and ${personIsInvited(values.personId)})
      for update of people
    ), existing as (
      select bookings.id, bookings.starts_at from bookings
      where bookings.day_id = ${values.dayId}::uuid
        and bookings.person_id = ${values.personId}::uuid
        and bookings.status = 'active'
    ), chosen as (
      select stations.id, stations.name from stations
      where stations.day_id = (select day.id from day)
        and exists (select 1 from person)
        and not exists (select 1 from existing)
        and (${values.stationId}::uuid is null or stations.id = ${values.stationId}::uuid)
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
      returning bookings.id, bookings.station_id, bookings.sequence
    ), queued as (
      select ${addJobExpression(values.mailTask, {
        payload: sql`json_build_object('bookingId', inserted.id, 'kind', 'booked')`,
      })} as job
      from inserted
    )
    select
      exists (select 1 from day) as "dayHolds",
      exists (select 1 from person) as "personFound",
      (select existing.id from existing) as "existingId",
      (select existing.starts_at from existing) as "existingStartsAt",
      (select count(*)::int from chosen) as candidates,
      -- Read so that the job is added (a CTE nothing reads may not run).
      (select count(*)::int from queued) as queued,
      inserted.id, inserted.station_id as "stationId", inserted.sequence,
      chosen.name as "stationName", person.name as "personName", person.email as "personEmail"
    from (select 1) as one
      left join inserted on true
      left join chosen on chosen.id = inserted.station_id
      left join person on true
  `.execute(db);
  const row = result.rows[0]!;
  if (row.id) {
    return {
      kind: 'booked',
      booking: {
        id: row.id,
        dayId: values.dayId,
        clientId: values.clientId,
        stationId: row.stationId,
        stationName: row.stationName,
        personId: values.personId,
        personName: row.personName,
        personEmail: row.personEmail,
        startsAt: values.startsAt,
        status: 'active',
        passToken: values.passToken,
        calendarUid: values.calendarUid,
        sequence: row.sequence,
        preferredName: values.preferredName,
        glasses: values.glasses,
        accessNeeds: values.accessNeeds,
        flashSensitive: values.flashSensitive,
        checkedIn: false,
      },
    };
  }
  if (!row.dayHolds) return { kind: 'day_changed' };
  if (!row.personFound) return { kind: 'no_person' };
  if (row.existingId && row.existingStartsAt) {
    return { kind: 'has_booking', bookingId: row.existingId, startsAt: row.existingStartsAt };
  }
  return row.candidates > 0 ? { kind: 'seat_lost' } : { kind: 'full' };
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
