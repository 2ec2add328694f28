import type { ShownSitting } from './apply-pending';

/**
 * The sittings a station may correct, as the server decides it: the one in the chair and the
 * last one finished there (by finishing time, then by start).
 */
export function correctableSittings(
  sittings: readonly ShownSitting[],
  stationId: string,
): { inChair: ShownSitting | null; lastFinished: ShownSitting | null } {
  const here = sittings.filter((sitting) => sitting.stationId === stationId);
  const inChair = here.find((sitting) => sitting.finishedAt === null) ?? null;
  let lastFinished: ShownSitting | null = null;
  for (const sitting of here) {
    if (sitting.finishedAt === null) continue;
    const later =
      !lastFinished ||
      sitting.finishedAt > lastFinished.finishedAt! ||
      (sitting.finishedAt === lastFinished.finishedAt &&
        sitting.startedAt > lastFinished.startedAt);
    if (later) lastFinished = sitting;
  }
  return { inChair, lastFinished };
}
