import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { CommitImportRequest, ImportSummary } from '../../../../server/schemas/roster';
import { api, ApiError } from '../../../lib/api-client';

export type CommitImportInput = { clientId: string; draftId: string } & CommitImportRequest & {
    /** Called when the server says another request is saving this import right now. */
    onWaiting?: () => void;
  };

const waitBeforeAskingAgainMs = 1000;

/**
 * Commits the draft. While another request (a second click, another tab) is saving it, the
 * server answers "being saved" at once; asking again after that answers with its result.
 */
export async function commitImport(input: CommitImportInput): Promise<ImportSummary> {
  for (;;) {
    try {
      return await api<ImportSummary>(
        `/clients/${input.clientId}/roster/imports/${input.draftId}/commit`,
        {
          method: 'POST',
          body: {
            officeTimeZones: input.officeTimeZones,
            deactivateMissing: input.deactivateMissing,
            rekeyConflicts: input.rekeyConflicts,
          },
        },
      );
    } catch (error) {
      if (!(error instanceof ApiError) || error.code !== 'import_being_saved') throw error;
      input.onWaiting?.();
      await new Promise((resolve) => setTimeout(resolve, waitBeforeAskingAgainMs));
    }
  }
}

export function useCommitImport() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: commitImport,
    onSuccess: async () => {
      await Promise.all([
        queryClient.invalidateQueries({ queryKey: ['people'] }),
        queryClient.invalidateQueries({ queryKey: ['clients'] }),
        queryClient.invalidateQueries({ queryKey: ['roster-history'] }),
        // A saved import is no longer open.
        queryClient.invalidateQueries({ queryKey: ['roster-open-import'] }),
      ]);
    },
  });
}
