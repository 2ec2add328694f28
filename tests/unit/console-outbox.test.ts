import { randomUUID } from 'node:crypto';
import { beforeEach, describe, expect, it, vi } from 'vitest';
import type { ConsoleAction, ConsoleActionResult } from '../../server/schemas/console';
import type { OutboxItem } from '../../src/features/station-console/model/outbox-item';
import { ApiError } from '../../src/lib/api-client';

// The outbox's order, retry and refusal rules are the product's own offline design (no outside
// source); what they protect is the frame-to-sitter record the matching depends on.

// IndexedDB stands in as a map: the outbox's ordering and retry rules are under test here.
const stored = new Map<string, OutboxItem>();
vi.mock('../../src/features/station-console/offline/outbox-store', () => ({
  outboxStore: {
    add: async (item: OutboxItem) => void stored.set(item.action.idempotencyKey, item),
    remove: async (key: string) => void stored.delete(key),
    list: async () => [...stored.values()].sort((a, b) => a.sequence - b.sequence),
  },
}));
const { Outbox } = await import('../../src/features/station-console/offline/outbox');

const stationId = randomUUID();
const checkIn = (label: string) => ({
  label,
  action: {
    kind: 'check_in_person',
    idempotencyKey: randomUUID(),
    stationId,
    tabletAt: new Date().toISOString(),
    checkInId: randomUUID(),
    personId: randomUUID(),
  } satisfies ConsoleAction,
});

function harness() {
  const sent: string[] = [];
  let network = true;
  const refused = new Set<string>();
  let signedIn = true;
  const outbox = new Outbox(
    'day',
    async (item): Promise<ConsoleActionResult> => {
      if (!network) throw new ApiError(0, 'network', 'No connection.');
      if (!signedIn) throw new ApiError(401, 'unauthenticated', 'Please sign in.');
      if (refused.has(item.label)) throw new ApiError(409, 'already_checked_in', 'Already in.');
      sent.push(item.label);
      return {
        idempotencyKey: item.action.idempotencyKey,
        kind: item.action.kind,
        replayed: false,
        message: `${item.label} saved`,
      };
    },
    async () => undefined,
  );
  return {
    outbox,
    sent,
    refused,
    setNetwork: (value: boolean) => {
      network = value;
    },
    setSignedIn: (value: boolean) => {
      signedIn = value;
    },
  };
}

beforeEach(() => stored.clear());

describe('offline outbox', () => {
  it('keeps every change while offline and replays them in the order they were recorded', async () => {
    const { outbox, sent, setNetwork } = harness();
    setNetwork(false);
    for (const label of ['first', 'second', 'third']) await outbox.submit(checkIn(label));
    await outbox.flush();
    expect(sent).toEqual([]);
    expect(outbox.waitingCount()).toBe(3);
    expect(outbox.getState().reachable).toBe(false);
    expect(stored.size).toBe(3);

    setNetwork(true);
    await outbox.flush();
    expect(sent).toEqual(['first', 'second', 'third']);
    expect(outbox.waitingCount()).toBe(0);
    expect(stored.size).toBe(0);
    outbox.stop();
  });

  it('sets a refused change aside, tells the photographer, and moves on to the next', async () => {
    const { outbox, sent, refused, setNetwork } = harness();
    setNetwork(false);
    const twice = checkIn('twice');
    await outbox.submit(twice);
    await outbox.submit(checkIn('after'));
    refused.add('twice');
    const told = new Set<string>();
    outbox.subscribe(() => outbox.getState().notices.forEach((notice) => told.add(notice.text)));
    setNetwork(true);
    await outbox.flush();
    expect(sent).toEqual(['after']);
    expect([...told]).toEqual(['Not saved — twice: Already in.', 'after saved']);
    // Kept on the tablet (a reload lists it again) but no longer waiting to be sent.
    expect(outbox.waitingCount()).toBe(0);
    expect(stored.get(twice.action.idempotencyKey)?.setAside?.reason).toBe('Already in.');
    const aside = outbox.getState().items.filter((item) => item.setAside);
    expect(aside.map((item) => item.label)).toEqual(['twice']);

    // Sent again once it can be saved; or discarded.
    refused.delete('twice');
    await outbox.sendAgain(twice.action.idempotencyKey);
    await vi.waitFor(() => expect(sent).toEqual(['after', 'twice']));
    expect(stored.size).toBe(0);
    outbox.stop();
  });

  it('sets aside a change the server keeps failing on (5xx), so the rest are not blocked', async () => {
    const sent: string[] = [];
    const outbox = new Outbox(
      'day',
      async (item): Promise<ConsoleActionResult> => {
        if (item.label === 'poisoned') throw new ApiError(500, 'internal', 'Something went wrong.');
        sent.push(item.label);
        return {
          idempotencyKey: item.action.idempotencyKey,
          kind: item.action.kind,
          replayed: false,
          message: `${item.label} saved`,
        };
      },
      async () => undefined,
    );
    const poisoned = checkIn('poisoned');
    await outbox.submit(poisoned);
    await outbox.submit(checkIn('behind'));
    // Each flush is one retry; the third server failure sets the change aside.
    for (let attempt = 0; attempt < 3; attempt += 1) await outbox.flush();
    expect(sent).toEqual(['behind']);
    expect(stored.get(poisoned.action.idempotencyKey)?.setAside?.reason).toBe(
      'the server could not save it (error 500).',
    );
    await outbox.discard(poisoned.action.idempotencyKey);
    expect(stored.size).toBe(0);
    expect(outbox.getState().items.filter((item) => !item.sent)).toEqual([]);
    outbox.stop();
  });

  it('shows one notice at a time: a new one replaces the last', async () => {
    const { outbox } = harness();
    await outbox.submit(checkIn('first'));
    await outbox.submit(checkIn('second'));
    await vi.waitFor(() =>
      expect(outbox.getState().notices.map((notice) => notice.text)).toEqual(['second saved']),
    );
    outbox.stop();
  });

  it('takes back a change that has not left the tablet, so it is never sent', async () => {
    const { outbox, sent, setNetwork } = harness();
    setNetwork(false);
    const item = checkIn('slip');
    await outbox.submit(item);
    await expect(outbox.withdraw(item.action.idempotencyKey)).resolves.toBe(true);
    setNetwork(true);
    await outbox.flush();
    expect(sent).toEqual([]);
    outbox.stop();
  });

  it('reloads what was waiting after the page is opened again', async () => {
    const first = harness();
    first.setNetwork(false);
    await first.outbox.submit(checkIn('kept'));
    first.outbox.stop();
    const second = harness();
    await second.outbox.load();
    await vi.waitFor(() => expect(second.sent).toEqual(['kept']));
    second.outbox.stop();
  });

  it('keeps changes when the session has ended, and sends them after signing in again', async () => {
    const { outbox, sent, setSignedIn } = harness();
    setSignedIn(false);
    await outbox.submit(checkIn('late'));
    await outbox.flush();
    expect(outbox.getState().signedOut).toBe(true);
    expect(stored.size).toBe(1);
    setSignedIn(true);
    await outbox.flush();
    expect(sent).toEqual(['late']);
    expect(outbox.getState().signedOut).toBe(false);
    outbox.stop();
  });

  it('offers to correct the first frame when the server refuses a last frame, and only then', async () => {
    const sittingId = randomUUID();
    const finish = (lastFrame: number | null) => ({
      label: `finish at ${lastFrame}`,
      action: {
        kind: 'finish_sitting',
        idempotencyKey: randomUUID(),
        stationId,
        tabletAt: new Date().toISOString(),
        sittingId,
        lastFrame,
      } satisfies ConsoleAction,
    });
    const outbox = new Outbox(
      'day',
      async (item) => {
        if (item.label === 'finish at 466') {
          throw new ApiError(400, 'implausible_last_frame', 'The last frame 0466 does not follow.');
        }
        throw new ApiError(409, 'already_finished', 'This sitting is already finished.');
      },
      async () => undefined,
    );
    await outbox.submit(finish(466));
    await outbox.submit(finish(null));
    await vi.waitFor(() => expect(outbox.getState().notices).toHaveLength(2));
    expect(outbox.getState().notices.map(({ text, fix }) => ({ text, fix }))).toEqual([
      {
        text: 'Not saved — finish at 466: The last frame 0466 does not follow.',
        fix: { sittingId, lastFrame: 466 },
      },
      { text: 'Not saved — finish at null: This sitting is already finished.', fix: undefined },
    ]);
    outbox.stop();
  });
});
