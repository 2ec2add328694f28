import type { Db } from '../../db/database';
import type { Viewer } from '../../lib/viewer';
import type { RecordedDay, RecordedOutcome, RecordedRow } from '../../schemas/day-record';
import * as bookingRepo from '../booking/booking.repository';
import type { DaysService } from '../days/days.service';
import { wallClockAt } from '../days/zoned-time';
import { recordedOfDay } from './day-record.repository';

/**
 * The after-the-day sheet: each station's bookings with what became of them, then everyone
 * photographed at the station without a booking there (walk-ins, people added on the day,
 * sitters booked at another station), in time order, with the frames the console recorded.
 */
export async function recordedDay(
  deps: { db: Db; days: DaysService },
  viewer: Viewer,
  dayId: string,
): Promise<RecordedDay> {
  const day = await deps.days.visibleDay(viewer, dayId);
  const [bookings, recorded] = await Promise.all([
    bookingRepo.activeBookingsOfDay(deps.db, dayId),
    recordedOfDay(deps.db, dayId),
  ]);
  const timeOf = (at: Date) => wallClockAt(at.getTime(), day.timeZone).time;
  const stationName = (id: string) => day.stations.find((station) => station.id === id)?.name;
  const noShows = new Set(recorded.noShows.map((row) => row.bookingId));
  const checkInOf = (personId: string) =>
    recorded.checkIns.find((row) => row.personId === personId);
  // A person has at most one sitting that counts: the last one started.
  const sittingOf = (personId: string) =>
    recorded.sittings.filter((row) => row.personId === personId).at(-1);

  const outcomeOf = (personId: string, stationId: string, bookingId: string | null) => {
    const sitting = sittingOf(personId);
    const checkIn = checkInOf(personId);
    let outcome: RecordedOutcome = 'not_recorded';
    if (sitting && sitting.stationId !== stationId) outcome = 'photographed_elsewhere';
    else if (sitting) outcome = sitting.finishedAt ? 'photographed' : 'in_chair';
    else if (checkIn) outcome = 'checked_in';
    else if (bookingId && noShows.has(bookingId)) outcome = 'no_show';
    return {
      outcome,
      checkedInAt: checkIn ? timeOf(checkIn.checkedInAt) : null,
      otherStationName:
        sitting && sitting.stationId !== stationId
          ? (stationName(sitting.stationId) ?? null)
          : null,
      firstFrame: sitting && sitting.stationId === stationId ? sitting.firstFrame : null,
      lastFrame: sitting && sitting.stationId === stationId ? sitting.lastFrame : null,
    };
  };

  return {
    dayId,
    officeName: day.officeName,
    date: day.date,
    timeZone: day.timeZone,
    stations: day.stations.map((station) => {
      const booked = bookings.filter((booking) => booking.stationId === station.id);
      const bookedHere = new Set(booked.map((booking) => booking.personId));
      const rows: Array<RecordedRow & { sortAt: number }> = booked.map((booking) => ({
        key: booking.id,
        sortAt: booking.startsAt.getTime(),
        localTime: timeOf(booking.startsAt),
        name: booking.personName,
        arrival: null,
        flashSensitive: booking.flashSensitive,
        ...outcomeOf(booking.personId, station.id, booking.id),
      }));
      for (const sitting of recorded.sittings) {
        if (sitting.stationId !== station.id || bookedHere.has(sitting.personId)) continue;
        if (sittingOf(sitting.personId) !== sitting) continue;
        const checkIn = checkInOf(sitting.personId);
        const at = checkIn?.checkedInAt ?? sitting.startedAt;
        rows.push({
          key: `sitting-${sitting.personId}`,
          sortAt: at.getTime(),
          localTime: timeOf(at),
          name: checkIn ? `${checkIn.givenName} ${checkIn.familyName}` : 'Unknown sitter',
          arrival: checkIn?.bookingId
            ? 'booked_elsewhere'
            : checkIn?.method === 'new_person'
              ? 'added_on_the_day'
              : 'walk_in',
          flashSensitive: bookings.some(
            (booking) => booking.personId === sitting.personId && booking.flashSensitive,
          ),
          ...outcomeOf(sitting.personId, station.id, null),
        });
      }
      rows.sort((a, b) => a.sortAt - b.sortAt);
      return {
        id: station.id,
        name: station.name,
        rows: rows.map(({ sortAt: _sortAt, ...row }) => row),
      };
    }),
  };
}
