import type { ConsoleStation, QueueEntry, SittingView } from '../../../../server/schemas/console';

/**
 * The other stations of the day (one room per day) that have a flash-sensitive sitter in the
 * chair right now. A neighbour's flash reaches that sitter too, so this station holds its
 * flashes while any of them is listed.
 */
export function neighbourFlashHolds(
  day: {
    stations: readonly ConsoleStation[];
    entries: readonly Pick<QueueEntry, 'personId' | 'flashSensitive'>[];
    sittings: readonly Pick<SittingView, 'personId' | 'stationId' | 'finishedAt'>[];
  },
  stationId: string,
): string[] {
  const sensitive = new Set(
    day.entries.filter((entry) => entry.flashSensitive).map((entry) => entry.personId),
  );
  const holding = new Set(
    day.sittings
      .filter(
        (sitting) =>
          sitting.finishedAt === null &&
          sitting.stationId !== stationId &&
          sensitive.has(sitting.personId),
      )
      .map((sitting) => sitting.stationId),
  );
  return day.stations
    .filter((station) => holding.has(station.id))
    .sort((a, b) => a.position - b.position)
    .map((station) => station.name);
}
