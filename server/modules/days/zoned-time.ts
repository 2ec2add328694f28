/**
 * Wall-clock time in an IANA zone <-> instants, using the zone data built into Intl.
 * No library: the conversions the booking code needs are small and testable against Intl.
 */

const formatters = new Map<string, Intl.DateTimeFormat>();

function formatterFor(timeZone: string): Intl.DateTimeFormat {
  let formatter = formatters.get(timeZone);
  if (!formatter) {
    formatter = new Intl.DateTimeFormat('en-GB', {
      timeZone,
      hourCycle: 'h23',
      year: 'numeric',
      month: '2-digit',
      day: '2-digit',
      hour: '2-digit',
      minute: '2-digit',
      second: '2-digit',
    });
    formatters.set(timeZone, formatter);
  }
  return formatter;
}

export function isValidTimeZone(timeZone: string): boolean {
  try {
    formatterFor(timeZone);
    return true;
  } catch {
    return false;
  }
}

export interface WallClock {
  date: string; // YYYY-MM-DD
  time: string; // HH:MM
  seconds: number;
}

/** The local date and time an instant shows in a zone. */
export function wallClockAt(instantMs: number, timeZone: string): WallClock {
  const parts: Record<string, string> = {};
  for (const part of formatterFor(timeZone).formatToParts(new Date(instantMs))) {
    parts[part.type] = part.value;
  }
  return {
    date: `${parts.year}-${parts.month}-${parts.day}`,
    time: `${parts.hour}:${parts.minute}`,
    seconds: Number(parts.second),
  };
}

/** Minutes the zone is ahead of UTC at an instant (e.g. 60 for BST, 330 for India). */
export function offsetMinutesAt(instantMs: number, timeZone: string): number {
  const wall = wallClockAt(instantMs, timeZone);
  const asUtc = wallAsUtcMs(wall.date, wall.time) + wall.seconds * 1000;
  const truncated = Math.floor(instantMs / 1000) * 1000;
  return Math.round((asUtc - truncated) / 60_000);
}

function wallAsUtcMs(date: string, time: string): number {
  const [year, month, day] = date.split('-').map(Number);
  const [hour, minute] = time.split(':').map(Number);
  return Date.UTC(year ?? 0, (month ?? 1) - 1, day ?? 1, hour ?? 0, minute ?? 0);
}

/**
 * The instant a local date and time names in a zone. Where clocks go back and the time occurs
 * twice, the earlier instant; where clocks go forward and it does not occur, the instant that
 * many minutes after the jump (the "compatible" rule of ECMAScript Temporal).
 */
export function zonedTimeToInstant(date: string, time: string, timeZone: string): number {
  const wall = wallAsUtcMs(date, time);
  const day = 24 * 60 * 60_000;
  const candidates = [offsetMinutesAt(wall - day, timeZone), offsetMinutesAt(wall + day, timeZone)];
  const matches = [...new Set(candidates)]
    .map((offset) => wall - offset * 60_000)
    .filter((instant) => {
      const shown = wallClockAt(instant, timeZone);
      return shown.date === date && shown.time === time;
    })
    .sort((a, b) => a - b);
  if (matches[0] !== undefined) return matches[0];
  // In a gap: read the wall time with the offset in force before the jump.
  return wall - offsetMinutesAt(wall - day, timeZone) * 60_000;
}

/** "UTC+01:00", "UTC+05:30": the offset a sitter sees beside a time. */
export function formatOffset(offsetMinutes: number): string {
  const sign = offsetMinutes < 0 ? '-' : '+';
  const absolute = Math.abs(offsetMinutes);
  const hours = String(Math.floor(absolute / 60)).padStart(2, '0');
  const minutes = String(absolute % 60).padStart(2, '0');
  return `UTC${sign}${hours}:${minutes}`;
}
