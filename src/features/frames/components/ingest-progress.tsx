import type { DayFramesOverview } from '../../../../server/schemas/frames';
import { plural } from '../../../lib/format';

/** Per station: how many frames are stored and how far reading them has come. */
export function IngestProgress({ overview }: { overview: DayFramesOverview }) {
  return (
    <div className="overflow-x-auto">
      <table className="w-full text-left text-sm">
        <thead className="text-ink-muted">
          <tr>
            <th scope="col" className="py-2 pr-4 font-medium">
              Station
            </th>
            <th scope="col" className="py-2 pr-4 font-medium">
              Frames
            </th>
            <th scope="col" className="py-2 pr-4 font-medium">
              Read
            </th>
            <th scope="col" className="py-2 pr-4 font-medium">
              Still to read
            </th>
            <th scope="col" className="py-2 pr-4 font-medium">
              Could not be read
            </th>
            <th scope="col" className="py-2 pr-4 font-medium">
              Slates found
            </th>
            <th scope="col" className="py-2 font-medium">
              Cameras
            </th>
          </tr>
        </thead>
        <tbody className="divide-y divide-line">
          {overview.stations.map((station) => {
            const pending = station.waiting + station.reading;
            return (
              <tr key={station.stationId}>
                <th scope="row" className="py-2 pr-4 font-medium">
                  {station.stationName}
                </th>
                <td className="py-2 pr-4">{station.frames.toLocaleString()}</td>
                <td className="py-2 pr-4">
                  {station.read.toLocaleString()}
                  {station.frames > 0 ? (
                    <progress
                      className="ml-2 h-2 w-24 align-middle"
                      max={station.frames}
                      value={station.read + station.failed}
                      aria-label={`${station.stationName}: frames read`}
                    />
                  ) : null}
                </td>
                <td className="py-2 pr-4">{pending > 0 ? pending.toLocaleString() : '—'}</td>
                <td
                  className={`py-2 pr-4 ${station.failed > 0 ? 'font-medium text-danger-700' : ''}`}
                >
                  {station.failed > 0 ? station.failed.toLocaleString() : '—'}
                </td>
                <td className="py-2 pr-4">{station.slates.toLocaleString()}</td>
                <td className="py-2 font-mono text-xs">
                  {station.cameras.length > 0 ? station.cameras.join(', ') : '—'}
                </td>
              </tr>
            );
          })}
        </tbody>
      </table>
      {overview.refusedUploads.length > 0 ? (
        <details className="mt-3">
          <summary className="min-h-touch cursor-pointer py-2 font-medium">
            {plural(overview.refusedUploads.length, 'file')} refused lately
          </summary>
          <ul className="flex flex-col gap-1 text-sm">
            {overview.refusedUploads.map((refusal) => (
              <li key={`${refusal.cardPath}-${refusal.at}`}>
                <span className="font-mono">{refusal.cardPath}</span>: {refusal.refusal}
              </li>
            ))}
          </ul>
        </details>
      ) : null}
    </div>
  );
}
