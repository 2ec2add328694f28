import { compareQueueEntries } from '../../../../server/schemas/console-rules';
import type {
  ConsoleAction,
  ConsoleSnapshot,
  QueueEntry,
  SittingView,
} from '../../../../server/schemas/console';
import type { OutboxItem } from './outbox-item';

export type ShownEntry = QueueEntry & { waiting: boolean };
export type ShownSitting = SittingView & { waiting: boolean };
export interface ShownConsole {
  entries: ShownEntry[];
  sittings: ShownSitting[];
}

/**
 * The console as the photographer should see it: the last snapshot from the server with the
 * changes still waiting on the tablet applied in order. Everything touched by a waiting change
 * is flagged, so the screen never presents it as saved.
 */
export function applyPending(
  snapshot: Pick<ConsoleSnapshot, 'entries' | 'sittings'>,
  items: readonly OutboxItem[],
): ShownConsole {
  const entries: ShownEntry[] = snapshot.entries.map((entry) => ({ ...entry, waiting: false }));
  const sittings: ShownSitting[] = snapshot.sittings.map((item) => ({ ...item, waiting: false }));
  const ordered = [...items].sort((a, b) => a.sequence - b.sequence);

  const entryOfPerson = (personId: string) => entries.find((entry) => entry.personId === personId);
  const entryOfCheckIn = (checkInId: string) =>
    entries.find((entry) => entry.checkIn?.id === checkInId);
  const refresh = (entry: ShownEntry) => {
    entry.waiting = true;
    if (!entry.checkIn) {
      entry.status = entry.noShow ? 'no_show' : entry.bookingId ? 'booked' : 'cancelled';
      return;
    }
    const own = sittings.filter((sitting) => sitting.personId === entry.personId);
    entry.status = own.some((sitting) => sitting.finishedAt === null)
      ? 'in_chair'
      : own.length > 0
        ? 'done'
        : 'arrived';
  };

  const apply = (action: ConsoleAction, item: OutboxItem) => {
    switch (action.kind) {
      case 'check_in_pass':
      case 'check_in_person':
      case 'check_in_new_person': {
        const personId =
          action.kind === 'check_in_pass'
            ? entries.find((entry) => entry.passHash !== null && entry.passHash === item.passHash)
                ?.personId
            : action.personId;
        if (!personId) return; // An unknown pass: only the server can say whose it is.
        let entry = entryOfPerson(personId);
        if (!entry) {
          entry = {
            key: action.checkInId,
            personId,
            name: item.personName ?? 'Walk-in',
            preferredName: null,
            bookingId: null,
            passHash: null,
            stationId: action.stationId,
            startsAt: null,
            status: 'arrived',
            walkIn: true,
            addedOnDay: action.kind === 'check_in_new_person',
            glasses: false,
            flashSensitive: false,
            accessNeeds: null,
            checkIn: null,
            noShow: null,
            waiting: true,
          };
          entries.push(entry);
        }
        if (entry.checkIn) return; // The server will refuse it; until then keep the first.
        entry.checkIn = {
          id: action.checkInId,
          at: action.tabletAt,
          stationId: action.stationId,
          byName: null,
        };
        entry.noShow = null;
        refresh(entry);
        return;
      }
      case 'start_sitting': {
        const entry = entryOfCheckIn(action.checkInId);
        if (!entry || sittings.some((item) => item.id === action.sittingId)) return;
        sittings.push({
          id: action.sittingId,
          personId: entry.personId,
          stationId: action.stationId,
          checkInId: action.checkInId,
          slateToken: action.slateToken,
          firstFrame: action.firstFrame,
          lastFrame: null,
          typedFirstFrame: action.firstFrame,
          typedLastFrame: null,
          framesCorrectedAt: null,
          startedAt: action.tabletAt,
          finishedAt: null,
          waiting: true,
        });
        refresh(entry);
        return;
      }
      case 'finish_sitting': {
        const sitting = sittings.find((item) => item.id === action.sittingId);
        if (!sitting) return;
        sitting.finishedAt = action.tabletAt;
        sitting.lastFrame = action.lastFrame;
        sitting.typedLastFrame = action.lastFrame;
        sitting.waiting = true;
        const entry = entryOfPerson(sitting.personId);
        if (entry) refresh(entry);
        return;
      }
      case 'correct_frames': {
        const sitting = sittings.find((item) => item.id === action.sittingId);
        // The server refuses a last frame for an open sitting; show it the same way.
        if (!sitting || (action.lastFrame !== undefined && sitting.finishedAt === null)) return;
        if (action.firstFrame !== undefined) sitting.firstFrame = action.firstFrame;
        if (action.lastFrame !== undefined) sitting.lastFrame = action.lastFrame;
        sitting.framesCorrectedAt = action.tabletAt;
        sitting.waiting = true;
        return;
      }
      case 'mark_no_show': {
        const entry = entries.find((item) => item.bookingId === action.bookingId);
        if (!entry || entry.checkIn) return;
        entry.noShow = { id: action.noShowId, at: action.tabletAt };
        refresh(entry);
        return;
      }
      case 'undo':
        if (item.target) revert(item.target);
        return;
    }
  };

  const revert = (target: ConsoleAction) => {
    if ('checkInId' in target && target.kind !== 'start_sitting') {
      const entry = entryOfCheckIn(target.checkInId);
      if (!entry) return;
      if (entry.walkIn) entries.splice(entries.indexOf(entry), 1);
      else {
        entry.checkIn = null;
        refresh(entry);
      }
    } else if (target.kind === 'start_sitting' || target.kind === 'finish_sitting') {
      const index = sittings.findIndex((item) => item.id === target.sittingId);
      const sitting = sittings[index];
      if (!sitting) return;
      if (target.kind === 'start_sitting') sittings.splice(index, 1);
      else {
        Object.assign(sitting, {
          finishedAt: null,
          lastFrame: null,
          typedLastFrame: null,
          waiting: true,
        });
      }
      const entry = entryOfPerson(sitting.personId);
      if (entry) refresh(entry);
    } else if (target.kind === 'mark_no_show') {
      const entry = entries.find((item) => item.noShow?.id === target.noShowId);
      if (!entry) return;
      entry.noShow = null;
      refresh(entry);
    }
  };

  for (const item of ordered) apply(item.action, item);
  entries.sort(compareQueueEntries);
  return { entries, sittings };
}
