import { queryOptions, useQuery } from '@tanstack/react-query';
import type { SessionList } from '../../../../server/schemas/auth';
import { api } from '../../../lib/api-client';

export const listSessions = () => api<SessionList>('/sessions');

export const sessionsQueryOptions = () =>
  queryOptions({ queryKey: ['sessions'], queryFn: listSessions });

export const useSessions = () => useQuery(sessionsQueryOptions());
