import { queryOptions, useQuery } from '@tanstack/react-query';
import type { ConsoleSnapshot } from '../../../../server/schemas/console';
import { api, ApiError } from '../../../lib/api-client';
import { snapshotStore } from '../offline/outbox-store';

export type LoadedSnapshot = ConsoleSnapshot & { fromTablet: boolean };

/** The day's console; without network, the copy this tablet last loaded. */
export async function getConsoleSnapshot(dayId: string): Promise<LoadedSnapshot> {
  try {
    const snapshot = await api<ConsoleSnapshot>(`/days/${dayId}/console`);
    await snapshotStore.save(snapshot).catch(() => undefined);
    return { ...snapshot, fromTablet: false };
  } catch (error) {
    if (error instanceof ApiError && error.status === 0) {
      const saved = await snapshotStore.load(dayId).catch(() => undefined);
      if (saved) return { ...saved, fromTablet: true };
    }
    throw error;
  }
}

export const consoleSnapshotQueryOptions = (dayId: string) =>
  queryOptions({
    queryKey: ['console', 'days', dayId, 'snapshot'],
    queryFn: () => getConsoleSnapshot(dayId),
    // Live events refresh it; this is the safety net when the event stream is down.
    refetchInterval: 30_000,
    networkMode: 'always',
  });

export const useConsoleSnapshot = (dayId: string) => useQuery(consoleSnapshotQueryOptions(dayId));
