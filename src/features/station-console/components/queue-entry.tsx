import type { QueueStatus } from '../../../../server/schemas/console';
import {
  formatFrame,
  mayMarkNoShow,
  noShowAllowedFrom,
} from '../../../../server/schemas/console-rules';
import { Button } from '../../../components/ui/button';
import type { ShownEntry, ShownSitting } from '../model/apply-pending';
import { NO_FLASH_WORDING } from '../../../../server/schemas/sitter-wording';

export const statusLabels: Record<QueueStatus, string> = {
  booked: 'Booked',
  arrived: 'Arrived',
  in_chair: 'In the chair',
  done: 'Done',
  no_show: 'No-show',
  cancelled: 'Cancelled',
};

const statusTones: Record<QueueStatus, string> = {
  booked: 'bg-paper-sunk text-ink',
  arrived: 'bg-spruce-100 text-spruce-800',
  in_chair: 'bg-spruce-600 text-paper-raised',
  done: 'bg-success-50 text-ink',
  no_show: 'bg-caution-50 text-ink',
  cancelled: 'bg-paper-sunk text-ink-muted line-through',
};

export interface EntryActions {
  checkIn(entry: ShownEntry): void;
  startSitting(entry: ShownEntry): void;
  finishSitting(entry: ShownEntry, sitting: ShownSitting): void;
  markNoShow(entry: ShownEntry): void;
}

/** One sitter in the queue, readable at arm's length, with the one or two next steps. */
export function QueueEntryCard({
  entry,
  isNext,
  openSitting,
  stationName,
  timeOf,
  now,
  graceMinutes,
  canAct,
  actions,
}: {
  entry: ShownEntry;
  isNext: boolean;
  openSitting: ShownSitting | undefined;
  stationName: string | null;
  timeOf: (iso: string) => string;
  now: Date;
  graceMinutes: number;
  canAct: boolean;
  actions: EntryActions;
}) {
  const noShowFrom = entry.startsAt ? noShowAllowedFrom(entry.startsAt, graceMinutes) : null;
  const noShowOpen = entry.startsAt ? mayMarkNoShow(entry.startsAt, graceMinutes, now) : false;
  return (
    <li
      aria-label={entry.name}
      className={`flex flex-wrap items-center gap-x-4 gap-y-2 rounded-card border bg-paper-raised p-3 ${
        entry.flashSensitive ? 'border-l-8 border-danger-600' : 'border-line'
      }`}
    >
      <div className="w-16 shrink-0 text-lg font-semibold tabular-nums">
        {entry.startsAt ? timeOf(entry.startsAt) : 'Walk-in'}
      </div>
      <div className="flex min-w-48 flex-1 flex-col gap-1">
        <p className="text-xl font-semibold">
          {entry.name}
          {entry.preferredName ? (
            <span className="font-normal text-ink-muted"> · “{entry.preferredName}”</span>
          ) : null}
        </p>
        <div className="flex flex-wrap gap-2 text-sm">
          {isNext ? (
            <span className="rounded-full border-2 border-clay-600 bg-clay-100 px-3 py-0.5 font-bold text-ink">
              Next
            </span>
          ) : null}
          <span className={`rounded-full px-3 py-1 font-semibold ${statusTones[entry.status]}`}>
            {statusLabels[entry.status]}
          </span>
          {entry.flashSensitive ? (
            <span className="rounded-full bg-danger-600 px-3 py-1 font-bold text-paper-raised">
              ⚠ {NO_FLASH_WORDING}
            </span>
          ) : null}
          {entry.glasses ? (
            <span className="rounded-full bg-clay-100 px-3 py-1 font-medium">Glasses</span>
          ) : null}
          {entry.walkIn ? (
            <span className="rounded-full bg-paper-sunk px-3 py-1 font-medium">
              {entry.addedOnDay ? 'Added today' : 'Walk-in'}
            </span>
          ) : null}
          {stationName ? <span className="px-1 py-1 text-ink-muted">{stationName}</span> : null}
          {openSitting ? (
            <span className="px-1 py-1 text-ink-muted">
              from frame {formatFrame(openSitting.firstFrame)}
            </span>
          ) : null}
          {entry.waiting ? (
            <span className="rounded-full border border-caution-600 px-3 py-0.5 font-semibold text-caution-600">
              Not yet saved
            </span>
          ) : null}
        </div>
        {entry.accessNeeds ? <p className="text-base text-ink-muted">{entry.accessNeeds}</p> : null}
      </div>
      {canAct ? (
        <div className="flex flex-wrap gap-2">
          {entry.status === 'booked' || entry.status === 'no_show' ? (
            <Button onClick={() => actions.checkIn(entry)}>Check in</Button>
          ) : null}
          {entry.status === 'arrived' || entry.status === 'done' ? (
            <Button onClick={() => actions.startSitting(entry)}>
              {entry.status === 'done' ? 'Retake' : 'Start sitting'}
            </Button>
          ) : null}
          {entry.status === 'in_chair' && openSitting ? (
            <Button onClick={() => actions.finishSitting(entry, openSitting)}>
              Finish sitting
            </Button>
          ) : null}
          {entry.status === 'booked' && entry.bookingId ? (
            noShowOpen ? (
              <Button variant="secondary" onClick={() => actions.markNoShow(entry)}>
                No-show
              </Button>
            ) : noShowFrom ? (
              <span className="self-center text-sm text-ink-muted">
                No-show from {timeOf(noShowFrom.toISOString())}
              </span>
            ) : null
          ) : null}
        </div>
      ) : null}
    </li>
  );
}
