import { describe, expect, it } from 'vitest';
import {
  compareQueueEntries,
  expectedNextFrame,
  formatFrame,
  frameAfter,
  framesInSitting,
  mostFramesInSitting,
  mayMarkNoShow,
  noShowAllowedFrom,
} from '../../server/schemas/console-rules';

describe('frame numbers (DCF 2.0, JEITA CP-3461: file numbers 0001-9999)', () => {
  it('counts up by one and rolls over from 9999 to 0001', () => {
    expect(frameAfter(1)).toBe(2);
    expect(frameAfter(9998)).toBe(9999);
    expect(frameAfter(9999)).toBe(1);
  });

  it('counts the frames of a sitting across the wrap from 9999 to 0001', () => {
    expect(framesInSitting(4521, 4540)).toBe(20);
    expect(framesInSitting(9990, 12)).toBe(22);
    // A last frame below the first without a wrap reads as thousands of frames: refused.
    expect(framesInSitting(4521, 4500)).toBeGreaterThan(mostFramesInSitting);
  });

  it('shows four digits as the camera does', () => {
    expect(formatFrame(1)).toBe('0001');
    expect(formatFrame(9999)).toBe('9999');
  });

  it("expects one after the latest sitting's last frame, across the rollover", () => {
    expect(expectedNextFrame([])).toBeNull();
    expect(
      expectedNextFrame([
        { startedAt: '2030-03-14T09:00:00Z', firstFrame: 10, lastFrame: 30 },
        { startedAt: '2030-03-14T09:05:00Z', firstFrame: 9990, lastFrame: 9999 },
      ]),
    ).toBe(1);
    expect(
      expectedNextFrame([
        { startedAt: '2030-03-14T09:10:00Z', firstFrame: 40, lastFrame: 52 },
        { startedAt: '2030-03-14T09:05:00Z', firstFrame: 31, lastFrame: 39 },
      ]),
    ).toBe(53);
  });

  it('makes no guess when the latest sitting has no last frame', () => {
    expect(
      expectedNextFrame([{ startedAt: '2030-03-14T09:00:00Z', firstFrame: 10, lastFrame: null }]),
    ).toBeNull();
  });
});

// The grace period (10 minutes by default) and the queue order are the product's own rules,
// set per day by the studio; they have no outside source.
describe('no-show grace period', () => {
  const startsAt = '2030-03-14T09:00:00Z';
  it('opens exactly grace minutes after the booked start', () => {
    expect(noShowAllowedFrom(startsAt, 10).toISOString()).toBe('2030-03-14T09:10:00.000Z');
    expect(mayMarkNoShow(startsAt, 10, new Date('2030-03-14T09:09:59Z'))).toBe(false);
    expect(mayMarkNoShow(startsAt, 10, new Date('2030-03-14T09:10:00Z'))).toBe(true);
    expect(mayMarkNoShow(startsAt, 0, new Date('2030-03-14T09:00:00Z'))).toBe(true);
  });
});

describe('queue order', () => {
  const entry = (
    name: string,
    startsAt: string | null,
    status: 'booked' | 'arrived' | 'in_chair' | 'done',
    checkInAt: string | null = null,
  ) => ({ name, startsAt, status, checkIn: checkInAt ? { at: checkInAt } : null });

  it('reads like the timetable, walk-ins by check-in time, the furthest along first on a tie', () => {
    const sorted = [
      entry('Walk-in', null, 'arrived', '2030-03-14T09:07:00Z'),
      entry('Later', '2030-03-14T09:10:00Z', 'booked'),
      entry('Booked', '2030-03-14T09:05:00Z', 'booked'),
      entry('Chair', '2030-03-14T09:05:00Z', 'in_chair'),
    ].sort(compareQueueEntries);
    expect(sorted.map((item) => item.name)).toEqual(['Chair', 'Booked', 'Walk-in', 'Later']);
  });
});
