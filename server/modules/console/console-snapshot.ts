import { createHash } from 'node:crypto';
import { compareQueueEntries } from '../../schemas/console-rules';
import type { QueueEntry, QueueStatus, SittingView } from '../../schemas/console';
import type * as repo from './console.repository';

type Rows<T extends (...args: never[]) => unknown> = Awaited<ReturnType<T>>;

/** Tablets match a scanned pass offline by its SHA-256; the token itself never leaves the server. */
export const passHash = (token: string) => createHash('sha256').update(token).digest('hex');

const fullName = (person: { givenName: string; familyName: string }) =>
  `${person.givenName} ${person.familyName}`;

/** Builds the queue from the day's bookings, check-ins, sittings and no-shows. */
export function buildQueue(input: {
  dayId: string;
  bookings: Rows<typeof repo.listBookings>;
  checkIns: Rows<typeof repo.listCheckIns>;
  sittings: Rows<typeof repo.listSittings>;
  noShows: Rows<typeof repo.listNoShows>;
}): { entries: QueueEntry[]; sittings: SittingView[] } {
  const sittings: SittingView[] = input.sittings.map((row) => ({
    id: row.id,
    personId: row.personId,
    stationId: row.stationId,
    checkInId: row.checkInId,
    slateToken: row.slateToken,
    firstFrame: row.firstFrame,
    lastFrame: row.lastFrame,
    // Rows written without typed numbers were never corrected: the numbers are as typed.
    typedFirstFrame: row.typedFirstFrame ?? row.firstFrame,
    typedLastFrame: row.framesCorrectedAt ? row.typedLastFrame : row.lastFrame,
    framesCorrectedAt: row.framesCorrectedAt ? row.framesCorrectedAt.toISOString() : null,
    startedAt: row.startedAt.toISOString(),
    finishedAt: row.finishedAt ? row.finishedAt.toISOString() : null,
  }));
  const checkInByPerson = new Map(input.checkIns.map((row) => [row.personId, row]));
  const noShowByBooking = new Map(input.noShows.map((row) => [row.bookingId, row]));
  const activeBookingPeople = new Set(
    input.bookings.filter((row) => row.status === 'active').map((row) => row.personId),
  );

  const statusOf = (personId: string, checkedIn: boolean, noShow: boolean, cancelled: boolean) => {
    if (checkedIn) {
      const own = sittings.filter((sitting) => sitting.personId === personId);
      if (own.some((sitting) => sitting.finishedAt === null)) return 'in_chair';
      return own.length > 0 ? 'done' : 'arrived';
    }
    if (noShow) return 'no_show';
    return cancelled ? 'cancelled' : 'booked';
  };

  const entries: QueueEntry[] = [];
  const seen = new Set<string>();
  for (const booking of input.bookings) {
    // A cancelled booking matters only when the person holds no active one that day.
    if (booking.status === 'cancelled' && activeBookingPeople.has(booking.personId)) continue;
    if (seen.has(booking.personId)) continue;
    seen.add(booking.personId);
    const checkIn = checkInByPerson.get(booking.personId);
    const noShow = noShowByBooking.get(booking.id);
    const status: QueueStatus = statusOf(
      booking.personId,
      Boolean(checkIn),
      Boolean(noShow),
      booking.status === 'cancelled',
    );
    entries.push({
      key: booking.id,
      personId: booking.personId,
      name: fullName(booking),
      preferredName: booking.preferredName,
      bookingId: booking.id,
      passHash: booking.status === 'active' ? passHash(booking.passToken) : null,
      stationId: booking.stationId,
      startsAt: booking.startsAt.toISOString(),
      status,
      walkIn: false,
      addedOnDay: booking.addedOnDayId === input.dayId,
      glasses: booking.glasses,
      flashSensitive: booking.flashSensitive,
      accessNeeds: booking.accessNeeds,
      checkIn: checkIn
        ? {
            id: checkIn.id,
            at: checkIn.checkedInAt.toISOString(),
            stationId: checkIn.stationId,
            byName: checkIn.byName,
          }
        : null,
      noShow: noShow ? { id: noShow.id, at: noShow.markedAt.toISOString() } : null,
    });
  }
  for (const checkIn of input.checkIns) {
    if (seen.has(checkIn.personId)) continue;
    entries.push({
      key: checkIn.id,
      personId: checkIn.personId,
      name: fullName(checkIn),
      preferredName: checkIn.preferredName,
      bookingId: null,
      passHash: null,
      stationId: checkIn.stationId,
      startsAt: null,
      status: statusOf(checkIn.personId, true, false, false),
      walkIn: true,
      addedOnDay: checkIn.addedOnDayId === input.dayId,
      glasses: false,
      flashSensitive: false,
      accessNeeds: null,
      checkIn: {
        id: checkIn.id,
        at: checkIn.checkedInAt.toISOString(),
        stationId: checkIn.stationId,
        byName: checkIn.byName,
      },
      noShow: null,
    });
  }
  entries.sort(compareQueueEntries);
  return { entries, sittings };
}
