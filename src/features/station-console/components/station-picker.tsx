import type { ConsoleDay } from '../../../../server/schemas/console';
import { Button } from '../../../components/ui/button';

/** Choose the day and station this tablet runs; the choice is remembered on the tablet. */
export function StationPicker({
  days,
  onPick,
}: {
  days: ConsoleDay[];
  onPick: (dayId: string, stationId: string) => void;
}) {
  if (days.length === 0) {
    return (
      <p className="text-lg text-ink-muted">
        No shoot days from today on. The studio assigns photographers to stations on each day.
      </p>
    );
  }
  return (
    <ul className="flex flex-col gap-4">
      {days.map((day) => (
        <li
          key={day.id}
          className="rounded-card border border-line bg-paper-raised p-4 shadow-card"
        >
          <h2 className="text-xl font-semibold">
            {day.date} · {day.clientName} · {day.officeName}
          </h2>
          <div className="mt-3 flex flex-wrap gap-2">
            {day.stations.map((station) => (
              <Button
                key={station.id}
                variant={station.mine ? 'primary' : 'secondary'}
                className="min-h-16 text-lg"
                onClick={() => onPick(day.id, station.id)}
              >
                {station.name}
                {station.photographerName ? ` · ${station.photographerName}` : ''}
              </Button>
            ))}
          </div>
        </li>
      ))}
    </ul>
  );
}
