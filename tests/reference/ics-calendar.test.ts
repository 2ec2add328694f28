import ICAL from 'ical.js';
import { describe, expect, it } from 'vitest';
import { foldLine, writeIcs, type SittingEvent } from '../../server/modules/booking/ics';

/** The independent parser is ical.js; each check names the clause of RFC 5545 / 5546 it follows. */
const event = (overrides: Partial<SittingEvent> = {}): SittingEvent => ({
  method: 'REQUEST',
  uid: '0b7e3f6a-2c1d-4e5f-8a9b-0c1d2e3f4a5b@likeness',
  sequence: 0,
  stampedAt: new Date('2027-02-20T10:11:12Z'),
  startsAt: new Date('2027-03-04T09:15:00Z'),
  endsAt: new Date('2027-03-04T09:20:00Z'),
  timeZone: 'Europe/London',
  summary: 'Portrait sitting (Halvorsen & Pike Engineering)',
  location: 'Meeting room 3, 4 Quillfield Row, Leeds',
  description: 'Station A; show your pass, please.',
  organizer: { name: 'Likeness bookings', email: 'bookings@northlight.example' },
  attendee: { name: 'Robin Sample', email: 'robin@halvorsen-pike.example' },
  ...overrides,
});

function parse(text: string) {
  const calendar = new ICAL.Component(ICAL.parse(text));
  const vevent = calendar.getFirstSubcomponent('vevent')!;
  return { calendar, vevent };
}

describe('calendar invitations (RFC 5545, RFC 5546)', () => {
  it('is a VCALENDAR with VERSION 2.0, PRODID and METHOD:REQUEST (RFC 5545 3.7, RFC 5546 3.2.2)', () => {
    const { calendar } = parse(writeIcs(event()));
    expect(calendar.getFirstPropertyValue('version')).toBe('2.0');
    expect(calendar.getFirstPropertyValue('prodid')).toBeTruthy();
    expect(calendar.getFirstPropertyValue('method')).toBe('REQUEST');
  });

  it('has exactly one UID and one DTSTAMP in UTC (RFC 5545 3.8.4.7, 3.8.7.2)', () => {
    const { vevent } = parse(writeIcs(event()));
    expect(vevent.getAllProperties('uid')).toHaveLength(1);
    expect(vevent.getAllProperties('dtstamp')).toHaveLength(1);
    expect(vevent.getFirstPropertyValue('uid')).toBe(
      '0b7e3f6a-2c1d-4e5f-8a9b-0c1d2e3f4a5b@likeness',
    );
    const stamp = vevent.getFirstPropertyValue('dtstamp') as ICAL.Time;
    expect(stamp.zone?.tzid).toBe('UTC');
    expect(stamp.toJSDate().toISOString()).toBe('2027-02-20T10:11:12.000Z');
  });

  it('writes DTSTART as local time with TZID and a matching VTIMEZONE (RFC 5545 3.2.19, 3.6.5)', () => {
    const text = writeIcs(
      event({
        startsAt: new Date('2027-07-01T08:15:00Z'),
        endsAt: new Date('2027-07-01T08:20:00Z'),
      }),
    );
    expect(text).toContain('DTSTART;TZID=Europe/London:20270701T091500\r\n');
    const { calendar, vevent } = parse(text);
    const timezone = new ICAL.Timezone(calendar.getFirstSubcomponent('vtimezone')!);
    expect(timezone.tzid).toBe('Europe/London');
    const start = vevent.getFirstProperty('dtstart')!;
    expect(start.getParameter('tzid')).toBe('Europe/London');
    const time = start.getFirstValue() as ICAL.Time;
    time.zone = timezone;
    // ical.js resolves the local time through our VTIMEZONE back to the instant we booked.
    expect(time.toJSDate().toISOString()).toBe('2027-07-01T08:15:00.000Z');
  });

  it('resolves local time through the VTIMEZONE in a half-hour zone too', () => {
    const text = writeIcs(
      event({
        timeZone: 'Asia/Kolkata',
        startsAt: new Date('2027-03-04T03:30:00Z'),
        endsAt: new Date('2027-03-04T03:35:00Z'),
      }),
    );
    expect(text).toContain('DTSTART;TZID=Asia/Kolkata:20270304T090000');
    const { calendar, vevent } = parse(text);
    const time = vevent.getFirstPropertyValue('dtstart') as ICAL.Time;
    time.zone = new ICAL.Timezone(calendar.getFirstSubcomponent('vtimezone')!);
    expect(time.toJSDate().toISOString()).toBe('2027-03-04T03:30:00.000Z');
  });

  it('writes the same zone section for every sitting of a season, on whole minutes (RFC 5545 3.6.5)', () => {
    const zoneOf = (text: string) =>
      text.slice(text.indexOf('BEGIN:VTIMEZONE'), text.indexOf('END:VTIMEZONE'));
    const morning = writeIcs(event({ startsAt: new Date('2027-07-01T08:15:00Z') }));
    const later = writeIcs(
      event({
        startsAt: new Date('2027-07-01T13:47:00Z'),
        stampedAt: new Date('2027-06-02T17:03:41Z'),
      }),
    );
    expect(zoneOf(later)).toBe(zoneOf(morning));
    // EU summer time (Directive 2000/84/EC art. 2): from 01:00 UTC on the last Sunday of March,
    // 28 March in 2027; the observance starts at that instant read in GMT (TZOFFSETFROM).
    expect(morning).toContain(
      'BEGIN:DAYLIGHT\r\nDTSTART:20270328T010000\r\nTZOFFSETFROM:+0000\r\nTZOFFSETTO:+0100',
    );
    const winter = writeIcs(
      event({
        timeZone: 'America/New_York',
        startsAt: new Date('2027-01-12T14:02:00Z'),
        endsAt: new Date('2027-01-12T14:07:00Z'),
      }),
    );
    // US daylight time (Energy Policy Act of 2005 §110) ends at 02:00 local on the first Sunday
    // of November: 1 November 2026.
    expect(winter).toContain(
      'BEGIN:STANDARD\r\nDTSTART:20261101T020000\r\nTZOFFSETFROM:-0400\r\nTZOFFSETTO:-0500',
    );
    for (const text of [morning, later, winter]) {
      for (const line of text.split('\r\n').filter((item) => item.startsWith('DTSTART:'))) {
        expect(line).toMatch(/00$/);
      }
    }
  });

  it('sends PUBLISH with the studio as organiser and no attendee when no reply is wanted (RFC 5546 3.2.1)', () => {
    const { calendar, vevent } = parse(writeIcs(event({ method: 'PUBLISH' })));
    expect(calendar.getFirstPropertyValue('method')).toBe('PUBLISH');
    expect(vevent.getAllProperties('organizer')).toHaveLength(1);
    expect(vevent.getAllProperties('attendee')).toHaveLength(0);
    expect(vevent.getFirstPropertyValue('uid')).toBe(
      '0b7e3f6a-2c1d-4e5f-8a9b-0c1d2e3f4a5b@likeness',
    );
  });

  it('raises SEQUENCE on a move and cancels with METHOD:CANCEL and the same UID (RFC 5546 2.1.4, 3.2.5)', () => {
    const moved = parse(writeIcs(event({ sequence: 1 })));
    expect(moved.vevent.getFirstPropertyValue('sequence')).toBe(1);
    const cancelled = parse(writeIcs(event({ sequence: 2, method: 'CANCEL' })));
    expect(cancelled.calendar.getFirstPropertyValue('method')).toBe('CANCEL');
    expect(cancelled.vevent.getFirstPropertyValue('uid')).toBe(
      moved.vevent.getFirstPropertyValue('uid'),
    );
    expect(cancelled.vevent.getFirstPropertyValue('status')).toBe('CANCELLED');
  });

  it('has ORGANIZER and ATTENDEE for an iTIP request (RFC 5546 3.2.2)', () => {
    const { vevent } = parse(writeIcs(event()));
    expect(vevent.getFirstPropertyValue('organizer')).toBe('mailto:bookings@northlight.example');
    expect(vevent.getFirstPropertyValue('attendee')).toBe('mailto:robin@halvorsen-pike.example');
  });

  it('escapes TEXT (RFC 5545 3.3.11) so the parser reads the words back unchanged', () => {
    const { vevent } = parse(writeIcs(event()));
    expect(vevent.getFirstPropertyValue('description')).toBe('Station A; show your pass, please.');
    expect(vevent.getFirstPropertyValue('summary')).toBe(
      'Portrait sitting (Halvorsen & Pike Engineering)',
    );
  });

  it('ends lines in CRLF and folds at 75 octets (RFC 5545 3.1)', () => {
    const text = writeIcs(event({ description: 'Ø'.repeat(120) }));
    const lines = text.split('\r\n');
    expect(text.endsWith('\r\n')).toBe(true);
    expect(text.replace(/\r\n/g, '')).not.toContain('\n');
    for (const line of lines) expect(Buffer.byteLength(line, 'utf8')).toBeLessThanOrEqual(75);
    expect(foldLine('x'.repeat(80)).split('\r\n ').join('')).toBe('x'.repeat(80));
    expect(parse(text).vevent.getFirstPropertyValue('description')).toBe('Ø'.repeat(120));
  });
});
