import type { AffectedBooking, DayChangePreview } from '../../../../server/schemas/day-changes';
import { Notice } from '../../../components/ui/notice';

const reasons: Record<AffectedBooking['reason'], string> = {
  station_removed: 'station removed',
  outside_hours: 'outside the new hours',
  day_moved: 'the day moved',
};

/** The bookings an edit touches, listed before anything is saved (and again after). */
export function DayChangePreviewList({
  preview,
  saved = false,
}: {
  preview: DayChangePreview;
  saved?: boolean;
}) {
  const touched = preview.moved.length + preview.cancelled.length;
  return (
    <section
      aria-label={saved ? 'What the change did' : 'What this change does'}
      className="flex flex-col gap-3"
    >
      {preview.blocked.length > 0 ? (
        <Notice tone="danger">This change cannot be saved: {preview.blocked.join(' ')}</Notice>
      ) : null}
      <p>
        Seats: {preview.seatsBefore} before, {preview.seatsAfter} after.{' '}
        {touched === 0
          ? 'Every booking still fits.'
          : `${touched} booking${touched === 1 ? '' : 's'} no longer fit${touched === 1 ? 's' : ''}.`}
        {preview.updated > 0
          ? ` ${preview.updated} sitter${preview.updated === 1 ? '' : 's'} get an updated invitation (the place changed).`
          : ''}
      </p>
      {touched > 0 ? (
        <ul aria-label="Bookings that no longer fit" className="flex flex-col gap-1 text-sm">
          {preview.moved.map((item) => (
            <li key={item.bookingId} className="border-b border-line py-1.5">
              {item.personName}: {item.from.localTime} at {item.from.stationName} (
              {reasons[item.reason]}){' → '}
              {saved ? 'moved to' : 'moves to'} {item.to?.localTime} at {item.to?.stationName}
            </li>
          ))}
          {preview.cancelled.map((item) => (
            <li key={item.bookingId} className="border-b border-line py-1.5 text-danger-700">
              {item.personName}: {item.from.localTime} at {item.from.stationName} (
              {reasons[item.reason]}){' → '}
              {saved ? 'cancelled' : 'is cancelled'}
            </li>
          ))}
        </ul>
      ) : null}
      {touched > 0 ? (
        <p className="text-sm text-ink-muted">
          Each sitter listed gets an e-mail with an updated calendar invitation, or a cancellation.
        </p>
      ) : null}
    </section>
  );
}
