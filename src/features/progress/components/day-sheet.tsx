import { Notice } from '../../../components/ui/notice';
import { useSchedule } from '../api/get-schedule';
import { NO_FLASH_WORDING } from '../../../../server/schemas/sitter-wording';

/** Empty rows under the bookings, for walk-ins written in by hand on the day. */
export const walkInRows = 8;

/**
 * One printable page per station: time, name, what helps (glasses, flash, access), a column
 * for the first and last frame written by hand, and blank rows for walk-ins.
 */
export function DaySheet({ dayId }: { dayId: string }) {
  const schedule = useSchedule(dayId);
  if (schedule.isPending) return <p role="status">Loading the day sheet…</p>;
  if (schedule.isError) return <Notice tone="danger">{schedule.error.message}</Notice>;
  const sheet = schedule.data;
  return (
    <div className="flex flex-col gap-8">
      {sheet.stations.map((station) => (
        <section key={station.id} className="break-after-page">
          <h2 className="text-xl font-semibold">
            {station.name} · {sheet.officeName} · {sheet.date}
          </h2>
          <p className="mb-3 text-sm text-ink-muted">
            {station.photographerName ?? 'No photographer yet'} · times in {sheet.timeZone} ·{' '}
            {sheet.room ? `${sheet.room}, ` : ''}
            {sheet.address}
          </p>
          {station.entries.length === 0 ? <p>No bookings at this station yet.</p> : null}
          <table
            aria-label={`${station.name} day sheet`}
            className="w-full border-collapse text-left text-sm"
          >
            <thead>
              <tr className="border-b-2 border-ink">
                <th className="py-1.5 pr-3">Time</th>
                <th className="py-1.5 pr-3">Name</th>
                <th className="py-1.5 pr-3">Notes</th>
                <th className="py-1.5 pr-3">Frames (first – last)</th>
                <th className="py-1.5">Done</th>
              </tr>
            </thead>
            <tbody>
              {station.entries.map((entry) => (
                <tr key={entry.bookingId} className="border-b border-line">
                  <td className="py-1.5 pr-3 tabular-nums">{entry.localTime}</td>
                  <td className="py-1.5 pr-3">
                    {entry.name}
                    {entry.preferredName ? ` (files: ${entry.preferredName})` : ''}
                  </td>
                  <td className="py-1.5 pr-3">
                    {[
                      entry.flashSensitive ? NO_FLASH_WORDING : null,
                      entry.glasses ? 'Glasses' : null,
                      entry.accessNeeds,
                    ]
                      .filter(Boolean)
                      .join(' · ')}
                  </td>
                  <td className="py-1.5 pr-3 text-ink-muted">____ – ____</td>
                  <td className="py-1.5">☐</td>
                </tr>
              ))}
              {Array.from({ length: walkInRows }, (_, index) => (
                <tr key={`walk-in-${index}`} className="h-9 border-b border-line">
                  <td className="py-1.5 pr-3 text-ink-muted">__:__</td>
                  <td className="py-1.5 pr-3 text-ink-muted">Walk-in:</td>
                  <td className="py-1.5 pr-3" />
                  <td className="py-1.5 pr-3 text-ink-muted">____ – ____</td>
                  <td className="py-1.5">☐</td>
                </tr>
              ))}
            </tbody>
          </table>
        </section>
      ))}
    </div>
  );
}
