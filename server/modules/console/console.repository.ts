import { sql, type Transaction } from 'kysely';
import type { Db } from '../../db/database';
import type { Database } from '../../db/types';
import { staffedBy } from '../../db/day-scope';

type Executor = Db | Transaction<Database>;

export async function findDay(db: Executor, dayId: string) {
  const day = await db
    .selectFrom('shootDays')
    .innerJoin('clients', 'clients.id', 'shootDays.clientId')
    .innerJoin('offices', 'offices.id', 'shootDays.officeId')
    .select([
      'shootDays.id',
      'shootDays.clientId',
      'shootDays.officeId',
      sql<string>`to_char(shoot_days.day_date, 'YYYY-MM-DD')`.as('date'),
      'clients.name as clientName',
      'offices.name as officeName',
      'shootDays.timeZone',
      'shootDays.address',
      'shootDays.room',
      'shootDays.slotMinutes',
      'shootDays.noShowGraceMinutes as graceMinutes',
    ])
    .where('shootDays.id', '=', dayId)
    .executeTakeFirst();
  if (!day) return undefined;
  const stations = await db
    .selectFrom('stations')
    .leftJoin('users', 'users.id', 'stations.photographerId')
    .select([
      'stations.id',
      'stations.name',
      'stations.position',
      'stations.photographerId',
      'users.displayName as photographerName',
    ])
    .where('stations.dayId', '=', dayId)
    .orderBy('stations.position')
    .execute();
  return { ...day, stations };
}
export type DayRecord = NonNullable<Awaited<ReturnType<typeof findDay>>>;

/** Days for the console picker, from yesterday on (a day may run past midnight UTC). */
export async function listDays(
  db: Db,
  filter: { photographerId: string | null; clientId: string | null },
) {
  let query = db
    .selectFrom('shootDays')
    .innerJoin('clients', 'clients.id', 'shootDays.clientId')
    .innerJoin('offices', 'offices.id', 'shootDays.officeId')
    .select([
      'shootDays.id',
      sql<string>`to_char(shoot_days.day_date, 'YYYY-MM-DD')`.as('date'),
      'clients.name as clientName',
      'offices.name as officeName',
    ])
    .where('shootDays.dayDate', '>=', sql<string>`current_date - 1`)
    .orderBy('shootDays.dayDate')
    .limit(50);
  if (filter.clientId) query = query.where('shootDays.clientId', '=', filter.clientId);
  if (filter.photographerId) query = query.where(staffedBy(filter.photographerId));
  return query.execute();
}

export function listStationsOfDays(db: Db, dayIds: string[]) {
  if (dayIds.length === 0) return Promise.resolve([]);
  return db
    .selectFrom('stations')
    .leftJoin('users', 'users.id', 'stations.photographerId')
    .select([
      'stations.id',
      'stations.dayId',
      'stations.name',
      'stations.position',
      'stations.photographerId',
      'users.displayName as photographerName',
    ])
    .where('stations.dayId', 'in', dayIds)
    .orderBy('stations.position')
    .execute();
}

export function listBookings(db: Executor, dayId: string) {
  return db
    .selectFrom('bookings')
    .innerJoin('people', 'people.id', 'bookings.personId')
    .select([
      'bookings.id',
      'bookings.personId',
      'bookings.stationId',
      'bookings.startsAt',
      'bookings.status',
      'bookings.passToken',
      'bookings.preferredName',
      'bookings.glasses',
      'bookings.accessNeeds',
      'bookings.flashSensitive',
      'people.givenName',
      'people.familyName',
      'people.addedOnDayId',
    ])
    .where('bookings.dayId', '=', dayId)
    .orderBy('bookings.startsAt')
    .execute();
}

export function listCheckIns(db: Executor, dayId: string) {
  return db
    .selectFrom('checkIns')
    .innerJoin('people', 'people.id', 'checkIns.personId')
    .leftJoin('users', 'users.id', 'checkIns.byUserId')
    .select([
      'checkIns.id',
      'checkIns.personId',
      'checkIns.bookingId',
      'checkIns.stationId',
      'checkIns.checkedInAt',
      'users.displayName as byName',
      'people.givenName',
      'people.familyName',
      'people.preferredName',
      'people.addedOnDayId',
    ])
    .where('checkIns.dayId', '=', dayId)
    .where('checkIns.undoneAt', 'is', null)
    .execute();
}

export function listSittings(db: Executor, dayId: string) {
  return db
    .selectFrom('sittings')
    .selectAll()
    .where('dayId', '=', dayId)
    .where('undoneAt', 'is', null)
    .orderBy('startedAt')
    .execute();
}

export function listNoShows(db: Executor, dayId: string) {
  return db
    .selectFrom('noShows')
    .select(['id', 'bookingId', 'markedAt'])
    .where('dayId', '=', dayId)
    .where('undoneAt', 'is', null)
    .execute();
}

/**
 * Every word typed must appear in the name, preferred name or employee id, ignoring case and
 * accents ("zoe mul" finds Zoë Müller; "HP-0042" finds that employee id).
 */
export function searchRoster(db: Db, clientId: string, dayId: string, text: string) {
  const words = text.split(/\s+/).filter(Boolean).slice(0, 6);
  const haystack = sql`unaccent(people.given_name || ' ' || people.family_name || ' ' || coalesce(people.preferred_name, '') || ' ' || coalesce(people.employee_id, ''))`;
  let query = db
    .selectFrom('people')
    .leftJoin('offices', 'offices.id', 'people.officeId')
    .select((eb) => [
      'people.id',
      'people.givenName',
      'people.familyName',
      'people.preferredName',
      'people.employeeId',
      'people.department',
      'offices.name as officeName',
      eb
        .exists(
          eb
            .selectFrom('checkIns')
            .select('checkIns.id')
            .whereRef('checkIns.personId', '=', 'people.id')
            .where('checkIns.dayId', '=', dayId)
            .where('checkIns.undoneAt', 'is', null),
        )
        .as('checkedIn'),
    ])
    .where('people.clientId', '=', clientId)
    .where('people.active', '=', true);
  for (const word of words) {
    const pattern = `%${word.replace(/[\\%_]/g, (match) => `\\${match}`)}%`;
    query = query.where(sql<boolean>`${haystack} ilike unaccent(${pattern})`);
  }
  return query.orderBy('people.familyName').orderBy('people.givenName').limit(20).execute();
}
