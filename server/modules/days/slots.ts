import { formatOffset, offsetMinutesAt, wallClockAt, zonedTimeToInstant } from './zoned-time';

/** What slot generation needs to know about a day; no database, no clock. */
export interface DayHours {
  date: string; // YYYY-MM-DD in the day's zone
  timeZone: string; // IANA name
  opensAt: string; // HH:MM local
  closesAt: string; // HH:MM local
  breaks: Array<{ start: string; end: string }>; // HH:MM local
  slotMinutes: number;
}

export interface Slot {
  startsAt: string; // ISO instant, UTC
  endsAt: string;
  localTime: string; // HH:MM on the day's wall clock
  offset: string; // e.g. UTC+01:00, so a repeated hour is never ambiguous
}

/**
 * The slots of a day, in order. Slots follow real elapsed time from opening to closing, so a
 * day across a clock change has as many slots as real minutes allow (one hour fewer in
 * spring, one more in autumn), and never two slots at the same instant. A slot that would
 * overlap a break or run past closing is left out. Each slot has one seat per station.
 */
export function generateSlots(day: DayHours): readonly Slot[] {
  // Pure and asked for on every claim: remember recent days (Intl time-zone maths is slow).
  const key = slotKey(day);
  const known = remembered.get(key);
  if (known) return known.slots;
  const slots = Object.freeze(computeSlots(day).map((slot) => Object.freeze(slot)));
  remembered.set(key, { slots, starts: new Set(slots.map((slot) => slot.startsAt)) });
  if (remembered.size > 500) remembered.delete(remembered.keys().next().value ?? '');
  return slots;
}

const slotKey = (day: DayHours) =>
  JSON.stringify([day.date, day.timeZone, day.opensAt, day.closesAt, day.breaks, day.slotMinutes]);

const remembered = new Map<string, { slots: readonly Slot[]; starts: Set<string> }>();

function computeSlots(day: DayHours): Slot[] {
  const step = day.slotMinutes * 60_000;
  if (!Number.isInteger(day.slotMinutes) || day.slotMinutes <= 0) return [];
  const toInstant = (time: string) => zonedTimeToInstant(day.date, time, day.timeZone);
  const opens = toInstant(day.opensAt);
  const closes = toInstant(day.closesAt);
  const breaks = day.breaks.map((pause) => ({
    start: toInstant(pause.start),
    end: toInstant(pause.end),
  }));

  const slots: Slot[] = [];
  let start = opens;
  while (start + step <= closes) {
    const end = start + step;
    const clash = breaks.find((pause) => start < pause.end && end > pause.start);
    if (clash) {
      // Resume at the end of the break, on the break's own boundary.
      start = Math.max(clash.end, start + 60_000);
      continue;
    }
    slots.push({
      startsAt: new Date(start).toISOString(),
      endsAt: new Date(end).toISOString(),
      localTime: wallClockAt(start, day.timeZone).time,
      offset: formatOffset(offsetMinutesAt(start, day.timeZone)),
    });
    start = end;
  }
  return slots;
}

/** Whether an instant is the start of one of the day's slots. */
export function isSlotStart(day: DayHours, startsAt: Date): boolean {
  generateSlots(day);
  return remembered.get(slotKey(day))?.starts.has(startsAt.toISOString()) ?? false;
}
