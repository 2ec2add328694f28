import type { Db } from '../../server/db/database';

/**
 * A confirmed shoot day with stations, booking open from long ago until the day itself.
 * Times are wall-clock times in the zone; the date is far enough ahead for any test clock.
 */
export async function insertDay(
  db: Db,
  input: {
    clientId: string;
    officeId: string;
    photographerIds: string[];
    date?: string;
    timeZone?: string;
    opensAt?: string;
    closesAt?: string;
    breaks?: Array<{ start: string; end: string }>;
    slotMinutes?: number;
    inviteBy?: 'office' | 'department' | 'list';
    inviteDepartments?: string[];
    changesCloseAt?: Date;
    bookingOpensAt?: Date;
    bookingClosesAt?: Date;
    status?: 'proposed' | 'confirmed';
  },
) {
  const date = input.date ?? '2030-03-14';
  const day = await db
    .insertInto('shootDays')
    .values({
      clientId: input.clientId,
      officeId: input.officeId,
      dayDate: date,
      timeZone: input.timeZone ?? 'Europe/London',
      address: '4 Quillfield Row, Leeds',
      room: 'Meeting room 3',
      opensAt: input.opensAt ?? '09:00',
      closesAt: input.closesAt ?? '12:00',
      breaks: JSON.stringify(input.breaks ?? []),
      slotMinutes: input.slotMinutes ?? 5,
      bookingOpensAt: input.bookingOpensAt ?? new Date('2020-01-01T00:00:00Z'),
      bookingClosesAt: input.bookingClosesAt ?? new Date(`${date}T00:00:00Z`),
      changesCloseAt: input.changesCloseAt ?? new Date(`${date}T00:00:00Z`),
      inviteBy: input.inviteBy ?? 'office',
      inviteDepartments: JSON.stringify(input.inviteDepartments ?? []),
      status: input.status ?? 'confirmed',
      createdByUserId: null,
    })
    .returning('id')
    .executeTakeFirstOrThrow();
  const stations = await db
    .insertInto('stations')
    .values(
      input.photographerIds.map((photographerId, index) => ({
        dayId: day.id,
        position: index + 1,
        name: `Station ${String.fromCharCode(65 + index)}`,
        photographerId,
      })),
    )
    .returning(['id', 'name'])
    .execute();
  return { id: day.id, date, stations };
}
