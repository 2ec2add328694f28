import type { Transaction } from 'kysely';
import type { Database } from '../../server/db/types';

/**
 * One shoot day per office of the demo client, in each office's own zone, staffed by the demo
 * photographers. Booking is open from the start of the demo until the evening before each day.
 */
const demoDays = [
  {
    office: 'Leeds',
    timeZone: 'Europe/London',
    date: '2027-03-04',
    closesBefore: '2027-03-03T17:00:00Z',
    address: '4 Quillfield Row, Leeds',
    room: 'Boardroom 2',
    stations: ['tomas@northlight.example', 'lotte@northlight.example'],
  },
  {
    office: 'Rotterdam',
    timeZone: 'Europe/Amsterdam',
    date: '2027-03-09',
    closesBefore: '2027-03-08T16:00:00Z',
    address: 'Brugmeesterkade 9, Rotterdam',
    room: 'Zaal 4',
    stations: ['lotte@northlight.example'],
  },
  {
    office: 'Porto',
    timeZone: 'Europe/Lisbon',
    date: '2027-03-16',
    closesBefore: '2027-03-15T17:00:00Z',
    address: 'Rua da Lanterna Velha 14, Porto',
    room: 'Sala 3',
    stations: ['tomas@northlight.example'],
  },
];

export async function insertDemoDays(
  trx: Transaction<Database>,
  clientId: string,
  officeIds: Map<string, string>,
): Promise<void> {
  const photographers = await trx
    .selectFrom('users')
    .select(['id', 'email'])
    .where('role', '=', 'photographer')
    .execute();
  const photographerId = (email: string) => photographers.find((row) => row.email === email)?.id;
  for (const day of demoDays) {
    const officeId = officeIds.get(day.office);
    if (!officeId) continue;
    const row = await trx
      .insertInto('shootDays')
      .values({
        clientId,
        officeId,
        dayDate: day.date,
        timeZone: day.timeZone,
        address: day.address,
        room: day.room,
        opensAt: '09:00',
        closesAt: '17:00',
        breaks: JSON.stringify([{ start: '12:30', end: '13:15' }]),
        slotMinutes: 5,
        bookingOpensAt: new Date('2026-11-01T08:00:00Z'),
        bookingClosesAt: new Date(day.closesBefore),
        changesCloseAt: new Date(day.closesBefore),
        inviteBy: 'office',
        inviteDepartments: '[]',
        status: 'confirmed',
        createdByUserId: null,
      })
      .returning('id')
      .executeTakeFirstOrThrow();
    await trx
      .insertInto('stations')
      .values(
        day.stations.map((email, index) => ({
          dayId: row.id,
          position: index + 1,
          name: `Station ${String.fromCharCode(65 + index)}`,
          photographerId: photographerId(email) ?? null,
        })),
      )
      .execute();
  }
}
