import type { SitterDay } from '../../../../server/schemas/booking';
import { Card } from '../../../components/ui/card';
import { EmptyState } from '../../../components/ui/empty-state';
import { Notice } from '../../../components/ui/notice';
import { formatCalendarDate } from '../../../lib/format';
import { useMyDays } from '../api/list-my-days';
import { BookSlotForm } from './book-slot-form';
import { MyBooking } from './my-booking';

const longDate = (day: SitterDay) => formatCalendarDate(day.date);

const inZone = (iso: string, timeZone: string) =>
  new Intl.DateTimeFormat('en-GB', { timeZone, dateStyle: 'long', timeStyle: 'short' }).format(
    new Date(iso),
  );

/** The sitter's shoot days: book a slot, or see the pass and move or cancel. */
export function SitterBookings() {
  const days = useMyDays();
  if (days.isPending) return <p role="status">Loading your shoot days…</p>;
  if (days.isError) return <Notice tone="danger">{days.error.message}</Notice>;
  if (days.data.days.length === 0) {
    return (
      <Card title="Your booking">
        <EmptyState title="No shoot day for you yet">
          When the studio opens booking for your office, you will get an e-mail and can pick a
          five-minute slot here.
        </EmptyState>
      </Card>
    );
  }
  return (
    <>
      {days.data.days.map((day) => (
        <Card key={day.id} title={`${longDate(day)} · ${day.officeName}`}>
          <p className="mb-4 text-sm text-ink-muted">
            {day.room ? `${day.room}, ` : ''}
            {day.address}
          </p>
          {day.booking ? (
            <MyBooking day={day} booking={day.booking} />
          ) : day.bookingOpen ? (
            <BookSlotForm day={day} />
          ) : new Date(day.bookingOpensAt) > new Date() ? (
            <Notice tone="info">Booking opens {inZone(day.bookingOpensAt, day.timeZone)}.</Notice>
          ) : (
            <Notice tone="info">
              Booking closed {inZone(day.bookingClosesAt, day.timeZone)}. Ask your coordinator if
              you still need a slot.
            </Notice>
          )}
        </Card>
      ))}
    </>
  );
}
