import { wallClockAt, zonedTimeToInstant } from '../modules/days/zoned-time';

/**
 * Date-time fields on the day form are read and written in the office's zone, whatever the
 * browser's zone is: `<input type="datetime-local">` values ("2030-03-14T18:00") to instants
 * and back. Shared with the client (pure; Intl's zone data only).
 */
export function officeLocalToInstant(value: string, timeZone: string): string {
  const match = /^(\d{4}-\d{2}-\d{2})T(\d{2}:\d{2})/.exec(value);
  if (!match?.[1] || !match[2]) return '';
  return new Date(zonedTimeToInstant(match[1], match[2], timeZone)).toISOString();
}

export function instantToOfficeLocal(instant: string, timeZone: string): string {
  const at = Date.parse(instant);
  if (Number.isNaN(at)) return '';
  const wall = wallClockAt(at, timeZone);
  return `${wall.date}T${wall.time}`;
}
