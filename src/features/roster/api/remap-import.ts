import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { ColumnMapping, RosterDraft } from '../../../../server/schemas/roster';
import { api } from '../../../lib/api-client';

export const remapImport = (input: { clientId: string; draftId: string; mapping: ColumnMapping }) =>
  api<RosterDraft>(`/clients/${input.clientId}/roster/imports/${input.draftId}/mapping`, {
    method: 'PUT',
    body: { mapping: input.mapping },
  });

export function useRemapImport() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: remapImport,
    // The preview rows of this draft changed, and so did the open import offered again.
    onSuccess: (_draft, input) =>
      Promise.all([
        queryClient.invalidateQueries({ queryKey: ['roster-preview', input.draftId] }),
        queryClient.invalidateQueries({ queryKey: ['roster-open-import', input.clientId] }),
      ]),
  });
}
