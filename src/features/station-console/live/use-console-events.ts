import { useQueryClient } from '@tanstack/react-query';
import { useEffect } from 'react';
import { consoleSnapshotQueryOptions } from '../api/get-console-snapshot';

/**
 * Live changes from the other tablets: the server pushes "changed" (from PostgreSQL
 * LISTEN/NOTIFY) and the console refetches. EventSource reconnects by itself; "ready" after a
 * reconnect refetches too, in case something changed while the stream was down.
 */
export function useConsoleEvents(dayId: string, stationId: string) {
  const queryClient = useQueryClient();
  useEffect(() => {
    const source = new EventSource(
      `/api/days/${dayId}/console/events?stationId=${encodeURIComponent(stationId)}`,
    );
    const refetch = () =>
      void queryClient.invalidateQueries({
        queryKey: consoleSnapshotQueryOptions(dayId).queryKey,
      });
    source.addEventListener('changed', refetch);
    source.addEventListener('ready', refetch);
    return () => source.close();
  }, [dayId, stationId, queryClient]);
}
