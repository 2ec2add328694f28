import type { AffectedBooking, DayChangePreview } from '../../schemas/day-changes';
import { generateSlots, isSlotStart, type DayHours } from './slots';
import { wallClockAt } from './zoned-time';

/** A station after the edit: `key` is its id, or a placeholder for one being added. */
export interface PlannedStation {
  key: string;
  name: string;
}

export interface PlanBooking {
  id: string;
  personName: string;
  stationId: string;
  stationName: string;
  startsAt: Date;
  checkedIn: boolean;
}

export interface DayChangePlan {
  moves: Array<{ bookingId: string; stationKey: string; startsAt: Date }>;
  cancels: string[];
  /** Bookings that keep their seat but whose invitation changes (place or room). */
  updates: string[];
  preview: DayChangePreview;
}

const minutesOfDay = (time: string) => Number(time.slice(0, 2)) * 60 + Number(time.slice(3, 5));

/**
 * What an edit does to a day's active bookings; pure, so the preview and the save agree.
 * A booking fits when its station stays and its start is still one of the day's slots. One
 * that does not fit moves, when asked to, to the free seat nearest its old wall-clock time
 * (its own station first), never into a slot that has begun; with no free seat it is cancelled.
 * A booking whose sitting has begun or is checked in cannot be moved: the edit is blocked.
 */
export function planDayChange(input: {
  before: { hours: DayHours; seats: number };
  after: { hours: DayHours; stations: PlannedStation[] };
  bookings: PlanBooking[];
  now: Date;
  resolution: 'move' | 'cancel';
  placeChanged: boolean;
}): DayChangePlan {
  const { after, now } = input;
  const kept = new Set(after.stations.map((station) => station.key));
  const stationName = new Map(after.stations.map((station) => [station.key, station.name]));
  const slots = generateSlots(after.hours);
  const taken = new Set<string>();
  const seat = (stationKey: string, startsAt: string) => `${stationKey}|${startsAt}`;
  const misfits: Array<{ booking: PlanBooking; reason: AffectedBooking['reason'] }> = [];
  const updates: string[] = [];
  const dateChanged = input.before.hours.date !== after.hours.date;

  for (const booking of input.bookings) {
    if (kept.has(booking.stationId) && isSlotStart(after.hours, booking.startsAt)) {
      taken.add(seat(booking.stationId, booking.startsAt.toISOString()));
      if (input.placeChanged) updates.push(booking.id);
      continue;
    }
    const reason = !kept.has(booking.stationId)
      ? 'station_removed'
      : dateChanged
        ? 'day_moved'
        : 'outside_hours';
    misfits.push({ booking, reason });
  }

  const blocked = misfits
    .filter(({ booking }) => booking.checkedIn || booking.startsAt <= now)
    .map(({ booking }) =>
      booking.checkedIn
        ? `${booking.personName} has checked in at ${booking.stationName}: keep their seat.`
        : `${booking.personName}'s sitting has begun: keep their seat.`,
    );

  const open = slots.filter((slot) => Date.parse(slot.startsAt) > now.getTime());
  const localTime = (at: Date) => wallClockAt(at.getTime(), input.before.hours.timeZone).time;
  const moves: DayChangePlan['moves'] = [];
  const cancels: string[] = [];
  const moved: AffectedBooking[] = [];
  const cancelled: AffectedBooking[] = [];
  const ordered = [...misfits].sort(
    (a, b) => a.booking.startsAt.getTime() - b.booking.startsAt.getTime(),
  );
  for (const { booking, reason } of ordered) {
    const from = { localTime: localTime(booking.startsAt), stationName: booking.stationName };
    const target = input.resolution === 'move' ? nearestFreeSeat(booking, from.localTime) : null;
    if (target) {
      taken.add(seat(target.stationKey, target.startsAt));
      moves.push({ bookingId: booking.id, ...target, startsAt: new Date(target.startsAt) });
      moved.push({
        bookingId: booking.id,
        personName: booking.personName,
        from,
        to: {
          localTime: wallClockAt(Date.parse(target.startsAt), after.hours.timeZone).time,
          stationName: stationName.get(target.stationKey) ?? '',
        },
        reason,
      });
    } else {
      cancels.push(booking.id);
      cancelled.push({
        bookingId: booking.id,
        personName: booking.personName,
        from,
        to: null,
        reason,
      });
    }
  }

  function nearestFreeSeat(booking: PlanBooking, wall: string) {
    const wanted = minutesOfDay(wall);
    const byDistance = [...open].sort(
      (a, b) =>
        Math.abs(minutesOfDay(a.localTime) - wanted) -
          Math.abs(minutesOfDay(b.localTime) - wanted) ||
        Date.parse(a.startsAt) - Date.parse(b.startsAt),
    );
    const stations = [
      ...after.stations.filter((station) => station.key === booking.stationId),
      ...after.stations.filter((station) => station.key !== booking.stationId),
    ];
    for (const slot of byDistance) {
      const free = stations.find((station) => !taken.has(seat(station.key, slot.startsAt)));
      if (free) return { stationKey: free.key, startsAt: slot.startsAt };
    }
    return null;
  }

  return {
    moves,
    cancels,
    updates,
    preview: {
      seatsBefore: input.before.seats,
      seatsAfter: slots.length * after.stations.length,
      moved,
      cancelled,
      updated: updates.length,
      blocked,
    },
  };
}
