import { queryOptions, useQuery } from '@tanstack/react-query';
import type { SessionResponse } from '../../../../server/schemas/auth';
import { api, ApiError } from '../../../lib/api-client';

/** The signed-in user, or null when nobody is signed in. */
export async function getSession(): Promise<SessionResponse | null> {
  try {
    return await api<SessionResponse>('/session');
  } catch (error) {
    if (error instanceof ApiError && error.status === 401) return null;
    throw error;
  }
}

export const sessionQueryOptions = () =>
  queryOptions({ queryKey: ['session'], queryFn: getSession, staleTime: 60_000 });

export const useSession = () => useQuery(sessionQueryOptions());
