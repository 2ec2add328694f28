import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import type { PreviewPage, PreviewQuery } from '../../../../server/schemas/roster';
import { api } from '../../../lib/api-client';

export const listPreviewRows = (clientId: string, draftId: string, query: PreviewQuery) => {
  const search = new URLSearchParams(
    Object.entries(query).map(([key, value]) => [key, String(value)]),
  );
  return api<PreviewPage>(`/clients/${clientId}/roster/imports/${draftId}/rows?${search}`);
};

export const previewRowsQueryOptions = (clientId: string, draftId: string, query: PreviewQuery) =>
  queryOptions({
    queryKey: ['roster-preview', draftId, query],
    queryFn: () => listPreviewRows(clientId, draftId, query),
    placeholderData: keepPreviousData,
  });

export const usePreviewRows = (clientId: string, draftId: string, query: PreviewQuery) =>
  useQuery(previewRowsQueryOptions(clientId, draftId, query));
