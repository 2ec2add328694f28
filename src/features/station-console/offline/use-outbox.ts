import { useQueryClient } from '@tanstack/react-query';
import { useEffect, useState, useSyncExternalStore } from 'react';
import { consoleSnapshotQueryOptions } from '../api/get-console-snapshot';
import { sendConsoleAction } from '../api/send-action';
import { Outbox } from './outbox';

/** One outbox per console page: loads what was waiting, sends when the network returns. */
export function useOutbox(dayId: string) {
  const queryClient = useQueryClient();
  const [outbox] = useState(
    () =>
      new Outbox(
        dayId,
        (item) => sendConsoleAction(item.dayId, item.action),
        () =>
          queryClient.refetchQueries(
            { queryKey: consoleSnapshotQueryOptions(dayId).queryKey },
            { throwOnError: true },
          ),
      ),
  );
  useEffect(() => {
    void outbox.load();
    const retry = () => void outbox.flush();
    window.addEventListener('online', retry);
    return () => {
      window.removeEventListener('online', retry);
      outbox.stop();
    };
  }, [outbox]);
  const state = useSyncExternalStore(outbox.subscribe, outbox.getState);
  return { outbox, state };
}

/** The browser's own idea of the network, as a hint next to our send results. */
export function useBrowserOnline() {
  return useSyncExternalStore(
    (listener) => {
      window.addEventListener('online', listener);
      window.addEventListener('offline', listener);
      return () => {
        window.removeEventListener('online', listener);
        window.removeEventListener('offline', listener);
      };
    },
    () => navigator.onLine,
  );
}
