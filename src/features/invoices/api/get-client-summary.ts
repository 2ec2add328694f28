import { queryOptions, useQuery } from '@tanstack/react-query';
import type { ClientSummary } from '../../../../server/schemas/invoices';
import { api } from '../../../lib/api-client';

export const clientSummaryQueryOptions = (clientId: string) =>
  queryOptions({
    queryKey: ['clients', clientId, 'summary'],
    queryFn: () => api<ClientSummary>(`/clients/${clientId}/summary`),
  });

export const useClientSummary = (clientId: string) => useQuery(clientSummaryQueryOptions(clientId));
