import type { Db } from '../../server/db/database';

/** A confirmed shoot day with stations, inserted directly (booking rules are not under test here). */
export async function insertDayWithStations(
  db: Db,
  input: {
    clientId: string;
    officeId: string;
    photographerIds: Array<string | null>;
    date?: string;
  },
) {
  const day = await db
    .insertInto('shootDays')
    .values({
      clientId: input.clientId,
      officeId: input.officeId,
      dayDate: input.date ?? '2027-03-04',
      timeZone: 'Europe/London',
      address: '4 Quillfield Row, Leeds',
      room: 'Boardroom 2',
      opensAt: '09:00',
      closesAt: '17:00',
      bookingOpensAt: new Date('2027-02-01T09:00:00Z'),
      bookingClosesAt: new Date('2027-03-03T17:00:00Z'),
      changesCloseAt: new Date('2027-03-03T17:00:00Z'),
      inviteBy: 'office',
      status: 'confirmed',
    })
    .returning('id')
    .executeTakeFirstOrThrow();
  const stations = [];
  for (const [index, photographerId] of input.photographerIds.entries()) {
    stations.push(
      await db
        .insertInto('stations')
        .values({
          dayId: day.id,
          position: index + 1,
          name: `Station ${index + 1}`,
          photographerId,
        })
        .returning(['id', 'name'])
        .executeTakeFirstOrThrow(),
    );
  }
  return { dayId: day.id, stations };
}
