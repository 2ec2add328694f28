import { useState } from 'react';
import type { ScheduleEntry } from '../../../../server/schemas/days';
import { Button } from '../../../components/ui/button';
import { EmptyState } from '../../../components/ui/empty-state';
import { Notice } from '../../../components/ui/notice';
import { useSchedule } from '../../progress/api/get-schedule';
import { useCancelBooking } from '../api/cancel-booking';
import { useMoveBooking } from '../api/move-booking';
import { SlotPicker } from './slot-picker';

/** Coordinators and the studio move or cancel a booking on the sitter's behalf. */
export function ManageBookings({ dayId }: { dayId: string }) {
  const schedule = useSchedule(dayId);
  if (schedule.isPending) return <p role="status">Loading the bookings…</p>;
  if (schedule.isError) return <Notice tone="danger">{schedule.error.message}</Notice>;
  const entries = schedule.data.stations
    .flatMap((station) => station.entries.map((entry) => ({ ...entry, stationName: station.name })))
    .sort((a, b) => a.startsAt.localeCompare(b.startsAt));
  if (entries.length === 0) {
    return (
      <EmptyState title="Nobody has booked yet">
        Bookings appear here as people claim their slots.
      </EmptyState>
    );
  }
  return (
    <ul aria-label="Bookings" className="flex flex-col divide-y divide-line">
      {entries.map((entry) => (
        <BookingRow key={entry.bookingId} dayId={dayId} entry={entry} />
      ))}
    </ul>
  );
}

function BookingRow({
  dayId,
  entry,
}: {
  dayId: string;
  entry: ScheduleEntry & { stationName: string };
}) {
  const [moving, setMoving] = useState(false);
  const [confirmingCancel, setConfirmingCancel] = useState(false);
  const [startsAt, setStartsAt] = useState('');
  const move = useMoveBooking();
  const cancel = useCancelBooking();
  const failure = move.error ?? cancel.error;

  return (
    <li aria-label={entry.name} className="flex flex-col gap-2 py-3">
      <div className="flex flex-wrap items-center gap-3">
        <span className="w-16 font-semibold tabular-nums">{entry.localTime}</span>
        <span className="flex-1">
          {entry.name} <span className="text-sm text-ink-muted">· {entry.stationName}</span>
        </span>
        {!moving && !confirmingCancel ? (
          <>
            <Button variant="secondary" onClick={() => setMoving(true)}>
              Move
            </Button>
            <Button variant="secondary" onClick={() => setConfirmingCancel(true)}>
              Cancel booking
            </Button>
          </>
        ) : null}
      </div>
      {failure ? <Notice tone="danger">{failure.message}</Notice> : null}
      {confirmingCancel ? (
        <div className="flex flex-wrap items-center gap-3">
          <span>Cancel {entry.name}&apos;s booking? They get a cancellation by e-mail.</span>
          <Button
            variant="danger"
            busy={cancel.isPending}
            onClick={() => cancel.mutate(entry.bookingId)}
          >
            Yes, cancel it
          </Button>
          <Button variant="quiet" onClick={() => setConfirmingCancel(false)}>
            Keep it
          </Button>
        </div>
      ) : null}
      {moving ? (
        <form
          aria-label={`Move ${entry.name}`}
          className="flex flex-col gap-3"
          onSubmit={(event) => {
            event.preventDefault();
            if (startsAt)
              move.mutate(
                { bookingId: entry.bookingId, startsAt },
                { onSuccess: () => setMoving(false) },
              );
          }}
        >
          <SlotPicker
            dayId={dayId}
            value={startsAt}
            onChange={setStartsAt}
            currentStartsAt={entry.startsAt}
          />
          <div className="flex gap-3">
            <Button type="submit" busy={move.isPending} disabled={!startsAt}>
              Move to this time
            </Button>
            <Button variant="quiet" onClick={() => setMoving(false)}>
              Keep the time
            </Button>
          </div>
        </form>
      ) : null}
    </li>
  );
}
