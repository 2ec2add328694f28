import { queryOptions, useQuery } from '@tanstack/react-query';
import type { RosterDraft } from '../../../../server/schemas/roster';
import { api } from '../../../lib/api-client';

/** The caller's own import for the client not yet saved (kept a day), or null. */
export const getOpenImport = (clientId: string) =>
  api<{ draft: RosterDraft | null }>(`/clients/${clientId}/roster/open-import`);

export const openImportQueryOptions = (clientId: string) =>
  queryOptions({
    queryKey: ['roster-open-import', clientId],
    queryFn: () => getOpenImport(clientId),
  });

export const useOpenImport = (clientId: string) => useQuery(openImportQueryOptions(clientId));
