import type { RecordedRow } from '../../../../server/schemas/day-record';
import { Notice } from '../../../components/ui/notice';
import { useRecordedDay } from '../api/get-recorded-day';

const outcomeWords: Record<RecordedRow['outcome'], string> = {
  photographed: 'Photographed',
  in_chair: 'Sitting not finished',
  checked_in: 'Checked in, no sitting',
  photographed_elsewhere: 'Photographed at',
  no_show: 'No-show',
  not_recorded: 'Nothing recorded',
};
const arrivalWords: Record<NonNullable<RecordedRow['arrival']>, string> = {
  walk_in: 'Walk-in',
  added_on_the_day: 'Added on the day',
  booked_elsewhere: 'Booked at another station',
};

const frames = (row: RecordedRow) =>
  row.firstFrame === null
    ? '—'
    : `${String(row.firstFrame).padStart(4, '0')} – ${
        row.lastFrame === null ? '?' : String(row.lastFrame).padStart(4, '0')
      }`;

/** The day sheet after the day: per station, what the console recorded for each person. */
export function RecordedSheet({ dayId }: { dayId: string }) {
  const recorded = useRecordedDay(dayId, true);
  if (recorded.isPending) return <p role="status">Loading what was recorded…</p>;
  if (recorded.isError) return <Notice tone="danger">{recorded.error.message}</Notice>;
  const sheet = recorded.data;
  return (
    <div className="flex flex-col gap-8">
      {sheet.stations.map((station) => (
        <section
          key={station.id}
          aria-label={`${station.name}, as recorded`}
          className="break-after-page"
        >
          <h2 className="text-xl font-semibold">
            {station.name} · {sheet.officeName} · {sheet.date} · as recorded
          </h2>
          <p className="mb-3 text-sm text-ink-muted">
            What the station console recorded · times in {sheet.timeZone}
          </p>
          {station.rows.length === 0 ? (
            <p>Nobody was booked or photographed at this station.</p>
          ) : (
            <table className="w-full border-collapse text-left text-sm">
              <thead>
                <tr className="border-b-2 border-ink">
                  <th className="py-1.5 pr-3">Time</th>
                  <th className="py-1.5 pr-3">Name</th>
                  <th className="py-1.5 pr-3">Checked in</th>
                  <th className="py-1.5 pr-3">Outcome</th>
                  <th className="py-1.5">Frames</th>
                </tr>
              </thead>
              <tbody>
                {station.rows.map((row) => (
                  <tr key={row.key} className="border-b border-line">
                    <td className="py-1.5 pr-3 tabular-nums">{row.localTime}</td>
                    <td className="py-1.5 pr-3">
                      {row.name}
                      {row.arrival ? ` (${arrivalWords[row.arrival]})` : ''}
                      {row.flashSensitive ? ' · NO FLASH' : ''}
                    </td>
                    <td className="py-1.5 pr-3 tabular-nums">{row.checkedInAt ?? '—'}</td>
                    <td className="py-1.5 pr-3">
                      {outcomeWords[row.outcome]}
                      {row.otherStationName ? ` ${row.otherStationName}` : ''}
                    </td>
                    <td className="py-1.5 tabular-nums">{frames(row)}</td>
                  </tr>
                ))}
              </tbody>
            </table>
          )}
        </section>
      ))}
    </div>
  );
}
