import { sql } from 'kysely';
import type { Db } from '../../db/database';

export interface PersonPlace {
  id: string;
  department: string | null;
  officeName: string | null;
}

/** What the console recorded for a day (undone actions left out), as sets of person ids. */
export async function consoleOutcomes(db: Db, dayId: string) {
  const [checkIns, sittings, noShows] = await Promise.all([
    db
      .selectFrom('checkIns')
      .select('personId')
      .where('dayId', '=', dayId)
      .where('undoneAt', 'is', null)
      .execute(),
    db
      .selectFrom('sittings')
      .select('personId')
      .where('dayId', '=', dayId)
      .where('undoneAt', 'is', null)
      .execute(),
    db
      .selectFrom('noShows')
      .innerJoin('bookings', 'bookings.id', 'noShows.bookingId')
      .select('bookings.personId')
      .where('noShows.dayId', '=', dayId)
      .where('noShows.undoneAt', 'is', null)
      .execute(),
  ]);
  return {
    checkedIn: new Set(checkIns.map((row) => row.personId)),
    photographed: new Set(sittings.map((row) => row.personId)),
    noShow: new Set(noShows.map((row) => row.personId)),
  };
}

/** Office and department of people who are not on the invite list (walk-ins). */
export async function placesOf(db: Db, ids: readonly string[]): Promise<PersonPlace[]> {
  if (ids.length === 0) return [];
  return db
    .selectFrom('people')
    .leftJoin('offices', 'offices.id', 'people.officeId')
    .select(['people.id', 'people.department', sql<string | null>`offices.name`.as('officeName')])
    .where('people.id', 'in', [...ids])
    .execute();
}
