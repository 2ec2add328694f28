import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { generateSlots, type DayHours } from '../../server/modules/days/slots';
import { zonedTimeToInstant } from '../../server/modules/days/zoned-time';

/**
 * The reference for every local time below is the IANA tz database as shipped in Node's Intl
 * (ECMA-402 DateTimeFormat with timeZone), formatted independently of the module under test.
 */
const reference = (iso: string, timeZone: string) =>
  new Intl.DateTimeFormat('en-GB', {
    timeZone,
    hour: '2-digit',
    minute: '2-digit',
    hourCycle: 'h23',
    timeZoneName: 'longOffset',
  }).format(new Date(iso));

const day = (overrides: Partial<DayHours>): DayHours => ({
  date: '2027-03-04',
  timeZone: 'Europe/London',
  opensAt: '09:00',
  closesAt: '17:00',
  breaks: [],
  slotMinutes: 5,
  ...overrides,
});

describe('slot generation', () => {
  it('gives 12 slots an hour per station at 5 minutes (common practice: 12 per station-hour)', () => {
    const slots = generateSlots(day({ opensAt: '09:00', closesAt: '10:00' }));
    expect(slots).toHaveLength(12);
    expect(slots[0]).toMatchObject({ startsAt: '2027-03-04T09:00:00.000Z', localTime: '09:00' });
    expect(slots.at(-1)?.localTime).toBe('09:55');
  });

  it('skips breaks and never lets a slot overlap one', () => {
    const slots = generateSlots(
      day({ breaks: [{ start: '12:30', end: '13:15' }], opensAt: '12:00', closesAt: '14:00' }),
    );
    const times = slots.map((slot) => slot.localTime);
    expect(times).toContain('12:25');
    expect(times).not.toContain('12:30');
    expect(times).not.toContain('13:10');
    expect(times).toContain('13:15');
    expect(slots).toHaveLength(6 + 9);
  });

  it('leaves out a last slot that would run past closing', () => {
    const slots = generateSlots(day({ opensAt: '09:00', closesAt: '09:12' }));
    expect(slots.map((slot) => slot.localTime)).toEqual(['09:00', '09:05']);
  });

  // Last Sunday of March 2027 is 28 March: in Europe/London 01:00 GMT jumps to 02:00 BST.
  it('Europe/London, last Sunday of March: the missing hour has no slots', () => {
    const slots = generateSlots(
      day({ date: '2027-03-28', opensAt: '00:30', closesAt: '03:00', slotMinutes: 30 }),
    );
    // 00:30 GMT to 03:00 BST is 90 real minutes.
    expect(slots.map((slot) => slot.localTime)).toEqual(['00:30', '02:00', '02:30']);
    for (const slot of slots) {
      expect(reference(slot.startsAt, 'Europe/London')).toContain(slot.localTime);
    }
    expect(reference(slots[1]!.startsAt, 'Europe/London')).toContain('GMT+01:00');
  });

  // Last Sunday of October 2027 is 31 October: 02:00 BST falls back to 01:00 GMT.
  it('Europe/London, last Sunday of October: the repeated hour is seated twice, never clashing', () => {
    const slots = generateSlots(
      day({ date: '2027-10-31', opensAt: '00:30', closesAt: '02:30', slotMinutes: 30 }),
    );
    // 00:30 BST to 02:30 GMT is 3 real hours.
    expect(slots).toHaveLength(6);
    expect(slots.map((slot) => slot.localTime)).toEqual([
      '00:30',
      '01:00',
      '01:30',
      '01:00',
      '01:30',
      '02:00',
    ]);
    expect(new Set(slots.map((slot) => slot.startsAt)).size).toBe(6);
    expect(slots[1]!.offset).toBe('UTC+01:00');
    expect(slots[3]!.offset).toBe('UTC+00:00');
    for (const slot of slots) {
      expect(reference(slot.startsAt, 'Europe/London')).toContain(slot.localTime);
    }
  });

  it('an ordinary working day across the spring change keeps its 8 hours of slots', () => {
    const slots = generateSlots(day({ date: '2027-03-28' }));
    expect(slots).toHaveLength(96);
    expect(slots[0]!.startsAt).toBe('2027-03-28T08:00:00.000Z');
  });

  it.each([
    ['Asia/Kolkata', '2027-03-04', '09:00', '2027-03-04T03:30:00.000Z'],
    ['Asia/Kathmandu', '2027-03-04', '09:00', '2027-03-04T03:15:00.000Z'],
    ['Australia/Adelaide', '2027-01-15', '09:00', '2027-01-14T22:30:00.000Z'],
    ['Australia/Adelaide', '2027-07-15', '09:00', '2027-07-14T23:30:00.000Z'],
    ['America/St_Johns', '2027-03-04', '09:00', '2027-03-04T12:30:00.000Z'],
  ])(
    'half-hour and quarter-hour zones: %s on %s opens at the right instant',
    (zone, date, time, utc) => {
      const slots = generateSlots(day({ timeZone: zone, date, opensAt: time, closesAt: '10:00' }));
      expect(slots[0]!.startsAt).toBe(utc);
      expect(slots).toHaveLength(12);
      for (const slot of slots) expect(reference(slot.startsAt, zone)).toContain(slot.localTime);
    },
  );

  it('converts local times like Intl does, for any zone and minute of 2027', () => {
    const zones = [
      'Europe/London',
      'Europe/Lisbon',
      'Europe/Amsterdam',
      'Asia/Kolkata',
      'Australia/Adelaide',
      'America/New_York',
    ];
    fc.assert(
      fc.property(
        fc.constantFrom(...zones),
        fc.integer({ min: 0, max: 364 * 24 * 60 }),
        (zone, minute) => {
          const instant = Date.UTC(2027, 0, 1) + minute * 60_000;
          const parts = new Intl.DateTimeFormat('sv-SE', {
            timeZone: zone,
            year: 'numeric',
            month: '2-digit',
            day: '2-digit',
            hour: '2-digit',
            minute: '2-digit',
            hourCycle: 'h23',
          }).format(new Date(instant));
          const [date, time] = parts.split(' ');
          const back = zonedTimeToInstant(date!, time!, zone);
          // Round trip holds except in the repeated hour, where the earlier instant is chosen.
          expect(back === instant || back === instant - 60 * 60_000).toBe(true);
        },
      ),
      { numRuns: 2000 },
    );
  });
});
