import { describe, expect, it } from 'vitest';
import type { ConsoleAction, QueueEntry } from '../../server/schemas/console';
import { applyPending } from '../../src/features/station-console/model/apply-pending';
import type { OutboxItem } from '../../src/features/station-console/model/outbox-item';

// How waiting changes overlay the last loaded queue is the product's own rule (no outside source).

const station = '00000000-0000-4000-8000-0000000000a1';
const entry = (overrides: Partial<QueueEntry>): QueueEntry => ({
  key: 'booking-1',
  personId: 'person-1',
  name: 'Aino Lindqvist',
  preferredName: null,
  bookingId: 'booking-1',
  passHash: 'hash-1',
  stationId: station,
  startsAt: '2030-03-14T09:00:00.000Z',
  status: 'booked',
  walkIn: false,
  addedOnDay: false,
  glasses: false,
  flashSensitive: false,
  accessNeeds: null,
  checkIn: null,
  noShow: null,
  ...overrides,
});
let sequence = 0;
const item = (action: Partial<ConsoleAction> & { kind: ConsoleAction['kind'] }, extra = {}) =>
  ({
    action: {
      idempotencyKey: `key-${sequence}`,
      stationId: station,
      tabletAt: '2030-03-14T09:01:00.000Z',
      ...action,
    } as ConsoleAction,
    dayId: 'day',
    label: 'change',
    sequence: sequence++,
    ...extra,
  }) satisfies OutboxItem;

describe('what the console shows while changes wait', () => {
  it('shows a scanned pass, a sitting and its finish as not yet saved', () => {
    const shown = applyPending({ entries: [entry({})], sittings: [] }, [
      item({ kind: 'check_in_pass', checkInId: 'c1', passToken: 'X' }, { passHash: 'hash-1' }),
      item({
        kind: 'start_sitting',
        sittingId: 's1',
        checkInId: 'c1',
        slateToken: 'A',
        firstFrame: 9999,
      }),
      item({ kind: 'finish_sitting', sittingId: 's1', lastFrame: 8 }),
    ]);
    expect(shown.entries[0]).toMatchObject({ status: 'done', waiting: true });
    expect(shown.sittings[0]).toMatchObject({ firstFrame: 9999, lastFrame: 8, waiting: true });
  });

  it('adds walk-ins under the name typed, and an undo takes them away again', () => {
    const walkIn = item(
      { kind: 'check_in_person', checkInId: 'c2', personId: 'person-2' },
      { personName: 'Bram de Wit' },
    );
    const shown = applyPending({ entries: [], sittings: [] }, [walkIn]);
    expect(shown.entries[0]).toMatchObject({ name: 'Bram de Wit', walkIn: true, waiting: true });
    const undone = applyPending({ entries: [], sittings: [] }, [
      walkIn,
      item({ kind: 'undo', targetKey: walkIn.action.idempotencyKey }, { target: walkIn.action }),
    ]);
    expect(undone.entries).toEqual([]);
  });

  it('leaves an unknown pass to the server and ignores a second check-in of the same sitter', () => {
    const known = entry({
      status: 'arrived',
      checkIn: { id: 'c0', at: '2030-03-14T08:59:00Z', stationId: station, byName: null },
    });
    const shown = applyPending({ entries: [known], sittings: [] }, [
      item({ kind: 'check_in_pass', checkInId: 'c3', passToken: 'Y' }, { passHash: 'other' }),
      item({ kind: 'check_in_person', checkInId: 'c4', personId: 'person-1' }),
    ]);
    expect(shown.entries).toHaveLength(1);
    expect(shown.entries[0]!.checkIn?.id).toBe('c0');
  });

  it('marks a no-show and a later undo brings the booking back', () => {
    const mark = item({ kind: 'mark_no_show', noShowId: 'n1', bookingId: 'booking-1' });
    expect(applyPending({ entries: [entry({})], sittings: [] }, [mark]).entries[0]!.status).toBe(
      'no_show',
    );
    const back = applyPending({ entries: [entry({})], sittings: [] }, [
      mark,
      item({ kind: 'undo', targetKey: mark.action.idempotencyKey }, { target: mark.action }),
    ]);
    expect(back.entries[0]!.status).toBe('booked');
  });

  it('shows a corrected first frame at once, keeping what was typed', () => {
    const start = item({
      kind: 'start_sitting',
      sittingId: 's5',
      checkInId: 'c5',
      slateToken: 'A',
      firstFrame: 4510,
    });
    const checkedIn = entry({
      status: 'arrived',
      checkIn: { id: 'c5', at: '2030-03-14T08:59:00Z', stationId: station, byName: null },
    });
    const shown = applyPending({ entries: [checkedIn], sittings: [] }, [
      start,
      item({ kind: 'correct_frames', sittingId: 's5', firstFrame: 451 }),
      item({ kind: 'finish_sitting', sittingId: 's5', lastFrame: 466 }),
    ]);
    expect(shown.sittings[0]).toMatchObject({
      firstFrame: 451,
      lastFrame: 466,
      typedFirstFrame: 4510,
      typedLastFrame: 466,
      framesCorrectedAt: '2030-03-14T09:01:00.000Z',
      waiting: true,
    });
    expect(shown.entries[0]!.status).toBe('done');
  });

  it('corrects a saved sitting’s last frame, but not the last frame of one still open', () => {
    const saved = {
      id: 's6',
      personId: 'person-1',
      stationId: station,
      checkInId: 'c6',
      slateToken: 'A',
      firstFrame: 100,
      lastFrame: 112,
      typedFirstFrame: 100,
      typedLastFrame: 112,
      framesCorrectedAt: null,
      startedAt: '2030-03-14T08:50:00.000Z',
      finishedAt: '2030-03-14T08:55:00.000Z',
    };
    const corrected = applyPending({ entries: [], sittings: [saved] }, [
      item({ kind: 'correct_frames', sittingId: 's6', lastFrame: 121 }),
    ]);
    expect(corrected.sittings[0]).toMatchObject({ lastFrame: 121, typedLastFrame: 112 });
    const open = applyPending({ entries: [], sittings: [{ ...saved, finishedAt: null }] }, [
      item({ kind: 'correct_frames', sittingId: 's6', lastFrame: 121 }),
    ]);
    expect(open.sittings[0]).toMatchObject({ lastFrame: 112, waiting: false });
  });

  it('an undone finish drops the typed last frame with the last frame', () => {
    const saved = {
      id: 's7',
      personId: 'person-1',
      stationId: station,
      checkInId: 'c7',
      slateToken: 'A',
      firstFrame: 200,
      lastFrame: null,
      typedFirstFrame: 200,
      typedLastFrame: null,
      framesCorrectedAt: null,
      startedAt: '2030-03-14T08:50:00.000Z',
      finishedAt: null,
    };
    const finish = item({ kind: 'finish_sitting', sittingId: 's7', lastFrame: 210 });
    const shown = applyPending({ entries: [], sittings: [saved] }, [
      finish,
      item({ kind: 'undo', targetKey: finish.action.idempotencyKey }, { target: finish.action }),
    ]);
    expect(shown.sittings[0]).toMatchObject({
      finishedAt: null,
      lastFrame: null,
      typedLastFrame: null,
    });
  });
});
