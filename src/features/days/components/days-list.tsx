import { Link } from 'react-router-dom';
import type { Day } from '../../../../server/schemas/days';
import { EmptyState } from '../../../components/ui/empty-state';

export function DaysList({ days, emptyHint }: { days: Day[]; emptyHint: string }) {
  if (days.length === 0) {
    return <EmptyState title="No shoot days yet">{emptyHint}</EmptyState>;
  }
  return (
    <ul className="flex flex-col gap-3">
      {days.map((day) => (
        <li key={day.id}>
          <Link
            to={`/days/${day.id}`}
            className="flex min-h-touch flex-col rounded-card border border-line bg-paper-raised p-4 hover:border-spruce-600"
          >
            <span className="font-semibold">
              {day.date} · {day.clientName} · {day.officeName}
            </span>
            <span className="text-sm text-ink-muted">
              {day.opensAt}–{day.closesAt} {day.timeZone} · {day.stations.length} station
              {day.stations.length === 1 ? '' : 's'} · {day.booked} of {day.seats} seats booked
              {day.status === 'proposed' ? ' · proposed, awaiting the studio' : ''}
              {day.status === 'cancelled' ? ' · cancelled' : ''}
            </span>
          </Link>
        </li>
      ))}
    </ul>
  );
}
