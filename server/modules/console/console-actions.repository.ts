import { sql, type Transaction } from 'kysely';
import type { Db } from '../../db/database';
import type { CheckInMethod } from '../../db/console-types';
import type { Database } from '../../db/types';

/** The console's writes and the locking reads they rely on. */
type Executor = Db | Transaction<Database>;

export function findActionByKey(db: Executor, idempotencyKey: string) {
  return db
    .selectFrom('stationActions')
    .selectAll()
    .where('idempotencyKey', '=', idempotencyKey)
    .executeTakeFirst();
}

/**
 * Serialises actions sharing one idempotency key until the holder's transaction ends. The key
 * is hashed into the advisory lock space; a rare collision only makes two actions wait in turn.
 */
export async function lockActionKey(db: Transaction<Database>, idempotencyKey: string) {
  await sql`select pg_advisory_xact_lock(hashtextextended(${`station_action:${idempotencyKey}`}, 0))`.execute(
    db,
  );
}

export async function insertAction(
  db: Executor,
  row: {
    idempotencyKey: string;
    dayId: string;
    stationId: string;
    userId: string;
    kind: string;
    payload: unknown;
    result: unknown;
    tabletAt: Date;
    receivedAt: Date;
  },
) {
  await db
    .insertInto('stationActions')
    .values({ ...row, payload: JSON.stringify(row.payload), result: JSON.stringify(row.result) })
    .execute();
}

export function findBookingByPassToken(db: Executor, passToken: string) {
  return db
    .selectFrom('bookings')
    .innerJoin('shootDays', 'shootDays.id', 'bookings.dayId')
    .select([
      'bookings.id',
      'bookings.dayId',
      'bookings.personId',
      'bookings.status',
      'shootDays.clientId',
      sql<string>`to_char(shoot_days.day_date, 'YYYY-MM-DD')`.as('date'),
    ])
    .where('bookings.passToken', '=', passToken)
    .forUpdate('bookings')
    .executeTakeFirst();
}

export function findBookingOnDay(db: Executor, dayId: string, bookingId: string) {
  return db
    .selectFrom('bookings')
    .select(['id', 'personId', 'status', 'startsAt', 'stationId'])
    .where('dayId', '=', dayId)
    .where('id', '=', bookingId)
    .executeTakeFirst();
}

export function findActiveBookingOfPerson(db: Executor, dayId: string, personId: string) {
  return db
    .selectFrom('bookings')
    .select(['id'])
    .where('dayId', '=', dayId)
    .where('personId', '=', personId)
    .where('status', '=', 'active')
    .executeTakeFirst();
}

export function findPerson(db: Executor, personId: string) {
  return db
    .selectFrom('people')
    .select(['id', 'clientId', 'active', 'givenName', 'familyName'])
    .where('id', '=', personId)
    .executeTakeFirst();
}

export async function insertPerson(
  db: Executor,
  person: {
    id: string;
    clientId: string;
    officeId: string;
    givenName: string;
    familyName: string;
    email: string;
    addedOnDayId: string;
  },
) {
  await db.insertInto('people').values(person).execute();
}

export function findActiveCheckIn(db: Executor, dayId: string, personId: string) {
  return db
    .selectFrom('checkIns')
    .innerJoin('stations', 'stations.id', 'checkIns.stationId')
    .select(['checkIns.id', 'checkIns.checkedInAt', 'stations.name as stationName'])
    .where('checkIns.dayId', '=', dayId)
    .where('checkIns.personId', '=', personId)
    .where('checkIns.undoneAt', 'is', null)
    .executeTakeFirst();
}

export async function insertCheckIn(
  db: Executor,
  row: {
    id: string;
    dayId: string;
    personId: string;
    bookingId: string | null;
    stationId: string;
    method: CheckInMethod;
    checkedInAt: Date;
    tabletAt: Date;
    byUserId: string;
  },
) {
  await db.insertInto('checkIns').values(row).execute();
}

export function findCheckIn(db: Executor, dayId: string, checkInId: string) {
  return db
    .selectFrom('checkIns')
    .select(['id', 'personId', 'bookingId', 'undoneAt'])
    .where('dayId', '=', dayId)
    .where('id', '=', checkInId)
    .forUpdate()
    .executeTakeFirst();
}

export function findSitting(db: Executor, dayId: string, sittingId: string) {
  return db
    .selectFrom('sittings')
    .selectAll()
    .where('dayId', '=', dayId)
    .where('id', '=', sittingId)
    .forUpdate()
    .executeTakeFirst();
}

/** The sittings a station may still correct: the one in the chair and the last one finished. */
export async function findCorrectableSittingIds(db: Executor, dayId: string, stationId: string) {
  const rows = await db
    .selectFrom('sittings')
    .select(['id', 'finishedAt'])
    .where('dayId', '=', dayId)
    .where('stationId', '=', stationId)
    .where('undoneAt', 'is', null)
    .orderBy(sql`finished_at desc nulls first`)
    .orderBy('startedAt', 'desc')
    .execute();
  const open = rows.find((row) => row.finishedAt === null);
  const lastFinished = rows.find((row) => row.finishedAt !== null);
  return [open?.id, lastFinished?.id].filter((id): id is string => id !== undefined);
}

export function findActiveNoShow(db: Executor, bookingId: string) {
  return db
    .selectFrom('noShows')
    .select(['id'])
    .where('bookingId', '=', bookingId)
    .where('undoneAt', 'is', null)
    .executeTakeFirst();
}

/** Wakes every listening app process; delivered only if the surrounding transaction commits. */
export async function notifyDayChanged(db: Executor, dayId: string) {
  await sql`select pg_notify('station_console', ${dayId})`.execute(db);
}
