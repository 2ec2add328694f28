import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { planDayChange, type PlanBooking } from '../../server/modules/days/day-change-plan';
import { generateSlots, type DayHours } from '../../server/modules/days/slots';
import { instantToOfficeLocal, officeLocalToInstant } from '../../server/schemas/office-time';

const hours = (overrides: Partial<DayHours> = {}): DayHours => ({
  date: '2030-03-14',
  timeZone: 'Europe/London',
  opensAt: '09:00',
  closesAt: '12:00',
  breaks: [],
  slotMinutes: 5,
  ...overrides,
});
const booking = (id: string, stationId: string, iso: string, checkedIn = false): PlanBooking => ({
  id,
  personName: `Sitter ${id}`,
  stationId,
  stationName: stationId === 'a' ? 'Station A' : 'Station B',
  startsAt: new Date(iso),
  checkedIn,
});
const before = { hours: hours(), seats: 72 };
const twoStations = [
  { key: 'a', name: 'Station A' },
  { key: 'b', name: 'Station B' },
];
const early = new Date('2030-01-01T00:00:00Z');

describe('planning a day change', () => {
  it('keeps what fits, moves what does not to the nearest free seat, and cancels when none is left', () => {
    const plan = planDayChange({
      before,
      // One station, 09:00–09:10: two seats for three bookings.
      after: { hours: hours({ closesAt: '09:10' }), stations: [twoStations[0]!] },
      bookings: [
        booking('1', 'a', '2030-03-14T09:00:00Z'),
        booking('2', 'b', '2030-03-14T09:00:00Z'),
        booking('3', 'a', '2030-03-14T11:00:00Z'),
      ],
      now: early,
      resolution: 'move',
      placeChanged: false,
    });
    expect(plan.moves).toEqual([
      { bookingId: '2', stationKey: 'a', startsAt: new Date('2030-03-14T09:05:00Z') },
    ]);
    expect(plan.cancels).toEqual(['3']);
    expect(plan.preview.cancelled[0]).toMatchObject({ reason: 'outside_hours', to: null });
    expect(plan.preview.moved[0]).toMatchObject({ reason: 'station_removed' });
    expect(plan.preview.seatsAfter).toBe(2);
  });

  it('cancels instead of moving when asked, and blocks a sitting that has begun or checked in', () => {
    const input = {
      before,
      after: { hours: hours({ opensAt: '10:00' }), stations: twoStations },
      bookings: [
        booking('1', 'a', '2030-03-14T09:00:00Z', true),
        booking('2', 'b', '2030-03-14T09:30:00Z'),
      ],
      resolution: 'cancel' as const,
      placeChanged: false,
    };
    const ahead = planDayChange({ ...input, now: early });
    expect(ahead.cancels).toEqual(['1', '2']);
    expect(ahead.preview.blocked).toEqual([expect.stringContaining('checked in')]);
    const during = planDayChange({ ...input, now: new Date('2030-03-14T09:31:00Z') });
    expect(during.preview.blocked).toHaveLength(2);
  });

  it('sends an updated invitation to bookings that keep their seat when the place changes', () => {
    const plan = planDayChange({
      before,
      after: { hours: hours(), stations: twoStations },
      bookings: [booking('1', 'a', '2030-03-14T09:00:00Z')],
      now: early,
      resolution: 'move',
      placeChanged: true,
    });
    expect(plan.updates).toEqual(['1']);
    expect(plan.moves).toEqual([]);
  });

  it('never double-books a seat and never drops a booking (property)', () => {
    fc.assert(
      fc.property(
        fc.array(fc.tuple(fc.constantFrom('a', 'b'), fc.integer({ min: 0, max: 35 })), {
          maxLength: 40,
        }),
        fc.integer({ min: 1, max: 30 }),
        fc.boolean(),
        (seats, closeAfter, dropB) => {
          const unique = [
            ...new Map(seats.map(([s, i]) => [`${s}${i}`, [s, i] as const])).values(),
          ];
          const bookings = unique.map(([station, index], n) =>
            booking(
              String(n),
              station,
              new Date(Date.UTC(2030, 2, 14, 9, index * 5)).toISOString(),
            ),
          );
          const closes = `${String(9 + Math.floor((closeAfter * 5) / 60)).padStart(2, '0')}:${String((closeAfter * 5) % 60).padStart(2, '0')}`;
          const after = {
            hours: hours({ closesAt: closes }),
            stations: dropB ? [twoStations[0]!] : twoStations,
          };
          const plan = planDayChange({
            before,
            after,
            bookings,
            now: early,
            resolution: 'move',
            placeChanged: false,
          });
          const moved = new Set(plan.moves.map((move) => move.bookingId));
          const cancelled = new Set(plan.cancels);
          const kept = bookings.filter((b) => !moved.has(b.id) && !cancelled.has(b.id));
          expect(kept.length + moved.size + cancelled.size).toBe(bookings.length);
          const starts = new Set(generateSlots(after.hours).map((slot) => slot.startsAt));
          const seatsTaken = [
            ...kept.map((b) => `${b.stationId}|${b.startsAt.toISOString()}`),
            ...plan.moves.map((m) => `${m.stationKey}|${m.startsAt.toISOString()}`),
          ];
          expect(new Set(seatsTaken).size).toBe(seatsTaken.length);
          for (const move of plan.moves) expect(starts.has(move.startsAt.toISOString())).toBe(true);
          // A cancellation only happens when every seat of the new day is taken.
          if (cancelled.size > 0)
            expect(seatsTaken.length).toBe(starts.size * after.stations.length);
        },
      ),
    );
  });
});

describe('office-zone date-times', () => {
  // Offsets from the IANA tz database (from memory): Berlin CET UTC+1 in winter, CEST UTC+2
  // in summer; Kolkata UTC+5:30 all year; New York EDT UTC-4 in July.
  it.each([
    ['2030-01-14T18:00', 'Europe/Berlin', '2030-01-14T17:00:00.000Z'],
    ['2030-07-14T18:00', 'Europe/Berlin', '2030-07-14T16:00:00.000Z'],
    ['2030-07-14T18:00', 'Asia/Kolkata', '2030-07-14T12:30:00.000Z'],
    ['2030-07-14T18:00', 'America/New_York', '2030-07-14T22:00:00.000Z'],
  ])('%s in %s is %s, whatever the process zone, and reads back the same', (local, zone, utc) => {
    expect(officeLocalToInstant(local, zone)).toBe(utc);
    expect(instantToOfficeLocal(utc, zone)).toBe(local);
  });

  it('leaves an empty or partial field empty rather than guessing', () => {
    expect(officeLocalToInstant('', 'Europe/Berlin')).toBe('');
    expect(officeLocalToInstant('2030-01-14', 'Europe/Berlin')).toBe('');
    expect(instantToOfficeLocal('not a time', 'Europe/Berlin')).toBe('');
  });
});
