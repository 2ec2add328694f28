import { offsetMinutesAt, wallClockAt } from '../days/zoned-time';

/**
 * A calendar invitation for one sitting (RFC 5545 iCalendar, RFC 5546 iTIP): METHOD:REQUEST
 * to book or move (SEQUENCE raised on every move) when the organiser's address takes replies,
 * METHOD:PUBLISH when no reply is wanted, METHOD:CANCEL with the same UID to cancel.
 */
export interface SittingEvent {
  method: 'REQUEST' | 'PUBLISH' | 'CANCEL';
  uid: string;
  sequence: number;
  stampedAt: Date;
  startsAt: Date;
  endsAt: Date;
  timeZone: string;
  summary: string;
  location: string;
  description: string;
  organizer: { name: string; email: string };
  attendee: { name: string; email: string };
}

/** RFC 5545 3.3.11: backslash, semicolon, comma and newline are escaped in TEXT values. */
export function escapeText(value: string): string {
  return value
    .replace(/\\/g, '\\\\')
    .replace(/;/g, '\\;')
    .replace(/,/g, '\\,')
    .replace(/\r?\n/g, '\\n');
}

/** RFC 5545 3.1: lines longer than 75 octets are folded with CRLF and one space. */
export function foldLine(line: string): string {
  const encoder = new TextEncoder();
  const pieces: string[] = [];
  let current = '';
  let octets = 0;
  for (const character of line) {
    const size = encoder.encode(character).length;
    const limit = pieces.length === 0 ? 75 : 74; // continuation lines start with a space
    if (octets + size > limit) {
      pieces.push(current);
      current = '';
      octets = 0;
    }
    current += character;
    octets += size;
  }
  pieces.push(current);
  return pieces.join('\r\n ');
}

const utcStamp = (date: Date) =>
  date
    .toISOString()
    .replace(/[-:]/g, '')
    .replace(/\.\d{3}/, '');

function localStamp(instant: Date, timeZone: string): string {
  const wall = wallClockAt(instant.getTime(), timeZone);
  return `${wall.date.replace(/-/g, '')}T${wall.time.replace(':', '')}${String(wall.seconds).padStart(2, '0')}`;
}

const offsetText = (minutes: number) => {
  const sign = minutes < 0 ? '-' : '+';
  const absolute = Math.abs(minutes);
  return `${sign}${String(Math.floor(absolute / 60)).padStart(2, '0')}${String(absolute % 60).padStart(2, '0')}`;
};

/**
 * RFC 5545 3.6.5 wants a VTIMEZONE for every TZID used. We describe the observance in force at
 * the event: it began at the last offset change before it (found by searching Intl's zone data
 * on whole minutes, so every message for the same season carries the same section).
 */
export function timeZoneComponent(timeZone: string, at: Date): string[] {
  const minute = 60_000;
  const offsetAtMinute = (index: number) => offsetMinutesAt(index * minute, timeZone);
  const atMinute = Math.floor(at.getTime() / minute);
  const offsetNow = offsetAtMinute(atMinute);
  const step = 30 * 24 * 60; // 30 days, in minutes
  const earliest = atMinute - 400 * 24 * 60;
  // Walk back in 30-day steps to the window holding the last change, then bisect to the minute.
  let high = atMinute;
  let low: number | null = null;
  for (let probe = high - step; probe >= earliest; probe -= step) {
    if (offsetAtMinute(probe) !== offsetNow) {
      low = probe;
      break;
    }
    high = probe;
  }
  let from = offsetNow;
  let since = Date.UTC(1970, 0, 1) - from * minute; // no change found: local 1970-01-01 00:00
  if (low !== null) {
    from = offsetAtMinute(low);
    while (high - low > 1) {
      const middle = Math.floor((low + high) / 2);
      if (offsetAtMinute(middle) === offsetNow) high = middle;
      else low = middle;
    }
    since = high * minute; // the first whole minute under the new offset
  }
  // Standard time is the smaller offset of the two; a zone without changes is standard.
  const kind = low !== null && offsetNow > from ? 'DAYLIGHT' : 'STANDARD';
  return [
    'BEGIN:VTIMEZONE',
    `TZID:${timeZone}`,
    `BEGIN:${kind}`,
    // An observance's DTSTART is local time read with the offset in force before the change.
    `DTSTART:${utcStamp(new Date(since + from * minute)).replace('Z', '')}`,
    `TZOFFSETFROM:${offsetText(from)}`,
    `TZOFFSETTO:${offsetText(offsetNow)}`,
    `END:${kind}`,
    'END:VTIMEZONE',
  ];
}

export function writeIcs(event: SittingEvent): string {
  const tzid = event.timeZone;
  const lines = [
    'BEGIN:VCALENDAR',
    'VERSION:2.0',
    'PRODID:-//Likeness//Portrait day bookings//EN',
    'CALSCALE:GREGORIAN',
    `METHOD:${event.method}`,
    ...timeZoneComponent(tzid, event.startsAt),
    'BEGIN:VEVENT',
    `UID:${event.uid}`,
    `DTSTAMP:${utcStamp(event.stampedAt)}`,
    `SEQUENCE:${event.sequence}`,
    `DTSTART;TZID=${tzid}:${localStamp(event.startsAt, tzid)}`,
    `DTEND;TZID=${tzid}:${localStamp(event.endsAt, tzid)}`,
    `SUMMARY:${escapeText(event.summary)}`,
    `LOCATION:${escapeText(event.location)}`,
    `DESCRIPTION:${escapeText(event.description)}`,
    `ORGANIZER;CN=${quoteParam(event.organizer.name)}:mailto:${event.organizer.email}`,
    // RFC 5546 3.2.1: a PUBLISH names no attendees; REQUEST and CANCEL name the sitter.
    ...(event.method === 'PUBLISH'
      ? []
      : [
          `ATTENDEE;CN=${quoteParam(event.attendee.name)};ROLE=REQ-PARTICIPANT;PARTSTAT=${event.method === 'CANCEL' ? 'DECLINED' : 'ACCEPTED'};RSVP=FALSE:mailto:${event.attendee.email}`,
        ]),
    `STATUS:${event.method === 'CANCEL' ? 'CANCELLED' : 'CONFIRMED'}`,
    'TRANSP:OPAQUE',
    'END:VEVENT',
    'END:VCALENDAR',
  ];
  return lines.map(foldLine).join('\r\n') + '\r\n';
}

/** RFC 5545 3.2: a parameter value with ':', ';' or ',' is quoted; DQUOTE itself is not allowed. */
function quoteParam(value: string): string {
  const clean = value.replace(/"/g, "'");
  return /[:;,]/.test(clean) ? `"${clean}"` : clean;
}
