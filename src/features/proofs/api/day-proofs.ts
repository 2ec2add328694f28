import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import type { ProofProgress } from '../../../../server/schemas/proofs';
import { api } from '../../../lib/api-client';

export const proofProgressQueryOptions = (dayId: string) =>
  queryOptions({
    queryKey: ['days', dayId, 'proofs'],
    queryFn: () => api<ProofProgress>(`/days/${dayId}/proofs`),
  });

export const useProofProgress = (dayId: string) => useQuery(proofProgressQueryOptions(dayId));

function useDayProofsMutation<Input, Output>(
  dayId: string,
  send: (input: Input) => Promise<Output>,
) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: send,
    onSettled: () => queryClient.invalidateQueries({ queryKey: ['days', dayId, 'proofs'] }),
  });
}

export const useReleaseProofs = (dayId: string) =>
  useDayProofsMutation(dayId, (input: { picksCloseOn?: string }) =>
    api<{ queued: number; alreadySent: number; toldOfNewDate: number; picksCloseAt: string }>(
      `/days/${dayId}/proofs/release`,
      { method: 'POST', body: input },
    ),
  );

export const useRemindProofs = (dayId: string) =>
  useDayProofsMutation(dayId, () =>
    api<{ queued: number; coolingDown: number; nextReminderAt: string | null }>(
      `/days/${dayId}/proofs/remind`,
      { method: 'POST' },
    ),
  );

export const useStudioPick = (dayId: string) =>
  useDayProofsMutation(dayId, (input: { personId: string; frameId: string }) =>
    api<{ personId: string; frameId: string }>(
      `/days/${dayId}/proofs/studio-picks/${input.personId}`,
      { method: 'PUT', body: { frameId: input.frameId } },
    ),
  );
