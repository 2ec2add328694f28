import { queryOptions, useQuery } from '@tanstack/react-query';
import type { ImportSummary } from '../../../../server/schemas/roster';
import { api } from '../../../lib/api-client';

export const listImportHistory = (clientId: string) =>
  api<{ imports: ImportSummary[] }>(`/clients/${clientId}/roster/history`);

export const importHistoryQueryOptions = (clientId: string) =>
  queryOptions({
    queryKey: ['roster-history', clientId],
    queryFn: () => listImportHistory(clientId),
  });

export const useImportHistory = (clientId: string) => useQuery(importHistoryQueryOptions(clientId));
