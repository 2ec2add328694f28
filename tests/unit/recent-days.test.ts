import { describe, expect, it } from 'vitest';
import { createRecentDays } from '../../server/modules/booking/recent-days';

describe('days remembered for claims', () => {
  it('forgets a day once it is older than the limit', () => {
    let now = 0;
    const days = createRecentDays<{ id: string }>({ maxAgeMs: 1000, now: () => now });
    days.remember({ id: 'a' });
    now = 1000;
    expect(days.get('a')).toEqual({ id: 'a' });
    now = 1001;
    expect(days.get('a')).toBeUndefined();
  });

  it('keeps at most the given number, dropping the one read longest ago', () => {
    const days = createRecentDays<{ id: string; n: number }>({ maxDays: 2 });
    days.remember({ id: 'a', n: 1 });
    days.remember({ id: 'b', n: 1 });
    days.remember({ id: 'a', n: 2 }); // read again: now the newest
    days.remember({ id: 'c', n: 1 });
    expect(days.get('b')).toBeUndefined();
    expect(days.get('a')).toEqual({ id: 'a', n: 2 });
    expect(days.get('c')).toEqual({ id: 'c', n: 1 });
    days.forget('a');
    expect(days.get('a')).toBeUndefined();
  });
});
