import { useQueryClient } from '@tanstack/react-query';
import { useEffect, useState } from 'react';
import { ApiError } from './api-client';

/** What the server answers (503) while PostgreSQL cannot be reached. */
export const DATABASE_UNAVAILABLE = 'database_unavailable';
export const OUTAGE_MESSAGE = 'The server cannot reach its database, retrying…';
const HEALTH_POLL_MS = 3000;

export const isDatabaseOutage = (error: unknown) =>
  error instanceof ApiError && error.code === DATABASE_UNAVAILABLE;

/** Asks /api/health every few seconds while `active`, and calls `onBack` once it answers 200. */
export function useWhenDatabaseIsBack(active: boolean, onBack: () => void) {
  useEffect(() => {
    if (!active) return undefined;
    let stopped = false;
    const timer = setInterval(() => {
      void fetch('/api/health', { credentials: 'same-origin' })
        .then((response) => {
          if (response.ok && !stopped) {
            stopped = true;
            clearInterval(timer);
            onBack();
          }
        })
        .catch(() => undefined);
    }, HEALTH_POLL_MS);
    return () => {
      stopped = true;
      clearInterval(timer);
    };
  }, [active, onBack]);
}

/**
 * True while a query or mutation has failed because the server cannot reach its database;
 * once health answers again every query is fetched afresh and the flag clears.
 */
export function useDatabaseOutage(): boolean {
  const queryClient = useQueryClient();
  const [outage, setOutage] = useState(false);
  useEffect(() => {
    const fromQueries = queryClient.getQueryCache().subscribe((event) => {
      if (event.type === 'updated' && isDatabaseOutage(event.query.state.error)) setOutage(true);
    });
    const fromMutations = queryClient.getMutationCache().subscribe((event) => {
      if (event.type === 'updated' && isDatabaseOutage(event.mutation.state.error)) {
        setOutage(true);
      }
    });
    return () => {
      fromQueries();
      fromMutations();
    };
  }, [queryClient]);
  const [onBack] = useState(() => () => {
    setOutage(false);
    void queryClient.invalidateQueries();
  });
  useWhenDatabaseIsBack(outage, onBack);
  return outage;
}
