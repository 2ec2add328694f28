import { queryOptions, useQuery } from '@tanstack/react-query';
import type { ClientProgress } from '../../../../server/schemas/days';
import { api } from '../../../lib/api-client';

export const getClientProgress = (clientId: string) =>
  api<ClientProgress>(`/clients/${clientId}/progress`);

export const clientProgressQueryOptions = (clientId: string) =>
  queryOptions({
    // Under ['days'] so every booking change refreshes it with the day views.
    queryKey: ['days', 'client-progress', clientId],
    queryFn: () => getClientProgress(clientId),
  });

export const useClientProgress = (clientId: string) =>
  useQuery(clientProgressQueryOptions(clientId));
