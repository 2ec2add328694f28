import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { CommitImportRequest, ImportSummary } from '../../../../server/schemas/roster';
import { api } from '../../../lib/api-client';

export const commitImport = (input: { clientId: string; draftId: string } & CommitImportRequest) =>
  api<ImportSummary>(`/clients/${input.clientId}/roster/imports/${input.draftId}/commit`, {
    method: 'POST',
    body: { officeTimeZones: input.officeTimeZones, deactivateMissing: input.deactivateMissing },
  });

export function useCommitImport() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: commitImport,
    onSuccess: async () => {
      await Promise.all([
        queryClient.invalidateQueries({ queryKey: ['people'] }),
        queryClient.invalidateQueries({ queryKey: ['clients'] }),
        queryClient.invalidateQueries({ queryKey: ['roster-history'] }),
      ]);
    },
  });
}
