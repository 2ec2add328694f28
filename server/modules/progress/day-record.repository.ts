import type { Db } from '../../db/database';

/** What the console recorded on a day, undone changes left out. */
export async function recordedOfDay(db: Db, dayId: string) {
  const [checkIns, sittings, noShows] = await Promise.all([
    db
      .selectFrom('checkIns')
      .innerJoin('people', 'people.id', 'checkIns.personId')
      .select([
        'checkIns.personId',
        'checkIns.bookingId',
        'checkIns.stationId',
        'checkIns.method',
        'checkIns.checkedInAt',
        'people.givenName',
        'people.familyName',
      ])
      .where('checkIns.dayId', '=', dayId)
      .where('checkIns.undoneAt', 'is', null)
      .execute(),
    db
      .selectFrom('sittings')
      .select(['personId', 'stationId', 'firstFrame', 'lastFrame', 'startedAt', 'finishedAt'])
      .where('dayId', '=', dayId)
      .where('undoneAt', 'is', null)
      .orderBy('startedAt')
      .execute(),
    db
      .selectFrom('noShows')
      .select(['bookingId'])
      .where('dayId', '=', dayId)
      .where('undoneAt', 'is', null)
      .execute(),
  ]);
  return { checkIns, sittings, noShows };
}
