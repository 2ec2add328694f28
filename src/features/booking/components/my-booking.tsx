import { useEffect, useRef, useState } from 'react';
import type { Booking, SitterDay } from '../../../../server/schemas/booking';
import { Button } from '../../../components/ui/button';
import { Notice } from '../../../components/ui/notice';
import { useCancelBooking } from '../api/cancel-booking';
import { useMoveBooking } from '../api/move-booking';
import { calendarFileUrl } from '../api/update-answers';
import { BookingAnswers } from './booking-answers';
import { SlotPicker } from './slot-picker';

const changesClose = (day: SitterDay) =>
  new Intl.DateTimeFormat('en-GB', {
    timeZone: day.timeZone,
    dateStyle: 'long',
    timeStyle: 'short',
  }).format(new Date(day.changesCloseAt));

/** The sitter's booking: the time in the day's zone, the pass, and move or cancel. */
export function MyBooking({ day, booking }: { day: SitterDay; booking: Booking }) {
  const [mode, setMode] = useState<'view' | 'move' | 'cancel'>('view');
  const [target, setTarget] = useState('');
  const move = useMoveBooking();
  const cancel = useCancelBooking();
  const moved = useRef<HTMLDivElement>(null);
  const showMoved = move.isSuccess && mode === 'view';
  useEffect(() => {
    // The move form sat lower on the page: bring the confirmation into view (phones).
    if (showMoved) {
      moved.current?.scrollIntoView({ block: 'center' });
      moved.current?.focus({ preventScroll: true });
    }
  }, [showMoved]);

  return (
    <div className="flex flex-col gap-4">
      <p className="text-lg">
        Booked for <strong>{booking.localTime}</strong> ({booking.timeZone}, {booking.offset}) at{' '}
        {booking.stationName}.
      </p>
      {showMoved ? (
        <div ref={moved} tabIndex={-1} className="outline-none">
          <Notice tone="success">
            Moved to {booking.localTime}. An updated calendar invitation is on its way.
          </Notice>
        </div>
      ) : null}
      <figure className="flex flex-col items-center gap-2 self-center">
        <img
          src={`/api/bookings/${booking.id}/pass.png?v=${booking.sequence}`}
          width={200}
          height={200}
          alt="Your pass: a square code the photographer scans at the station"
          className="rounded-control border border-line"
        />
        <figcaption className="text-sm text-ink-muted">
          Your pass. Show it at the station; it holds no personal details.
        </figcaption>
      </figure>
      <a
        href={calendarFileUrl(booking)}
        download="portrait-sitting.ics"
        className="inline-flex min-h-touch items-center self-start font-medium text-spruce-700 underline"
      >
        Add to my calendar (.ics file)
      </a>
      <BookingAnswers
        key={booking.sequence}
        booking={booking}
        canChange={booking.status === 'active'}
      />
      {!booking.canChange ? (
        <Notice tone="info">
          Changes closed on {changesClose(day)}. Ask your coordinator to change it.
        </Notice>
      ) : mode === 'view' ? (
        <div className="flex flex-col gap-2 sm:flex-row">
          <Button variant="secondary" onClick={() => setMode('move')}>
            Move my sitting
          </Button>
          <Button variant="quiet" onClick={() => setMode('cancel')}>
            Cancel my sitting
          </Button>
        </div>
      ) : mode === 'move' ? (
        <form
          aria-label="Move my sitting"
          className="flex flex-col gap-3"
          onSubmit={(event) => {
            event.preventDefault();
            if (!target) return;
            move.mutate(
              { bookingId: booking.id, startsAt: target },
              { onSuccess: () => setMode('view') },
            );
          }}
        >
          {move.isError ? <Notice tone="danger">{move.error.message}</Notice> : null}
          <SlotPicker
            dayId={day.id}
            value={target}
            onChange={setTarget}
            currentStartsAt={booking.startsAt}
          />
          <div className="flex flex-col gap-2 sm:flex-row">
            <Button type="submit" busy={move.isPending} disabled={!target}>
              Move to this time
            </Button>
            <Button variant="secondary" onClick={() => setMode('view')}>
              Keep my time
            </Button>
          </div>
        </form>
      ) : (
        <div className="flex flex-col gap-2">
          {cancel.isError ? <Notice tone="danger">{cancel.error.message}</Notice> : null}
          <p>
            Cancel your sitting at {booking.localTime}? You can book again while booking is open.
          </p>
          <div className="flex flex-col gap-2 sm:flex-row">
            <Button
              variant="danger"
              busy={cancel.isPending}
              onClick={() => cancel.mutate(booking.id)}
            >
              Yes, cancel it
            </Button>
            <Button variant="secondary" onClick={() => setMode('view')}>
              Keep it
            </Button>
          </div>
        </div>
      )}
    </div>
  );
}
