import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import type {
  ProofDaySummary,
  SavePicksRequest,
  SitterProofs,
} from '../../../../server/schemas/proofs';
import { api } from '../../../lib/api-client';

export const myProofDaysQueryOptions = () =>
  queryOptions({
    queryKey: ['proofs', 'mine'],
    queryFn: () => api<{ days: ProofDaySummary[] }>('/proofs'),
  });

export const useMyProofDays = () => useQuery(myProofDaysQueryOptions());

export const proofsQueryOptions = (dayId: string) =>
  queryOptions({
    queryKey: ['proofs', 'mine', dayId],
    queryFn: () => api<SitterProofs>(`/proofs/${dayId}`),
    // The image URLs are signed for an hour: fetch fresh ones well before they lapse.
    staleTime: 30 * 60_000,
    refetchInterval: 30 * 60_000,
  });

export const useProofs = (dayId: string) => useQuery(proofsQueryOptions(dayId));

export function useSavePicks(dayId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (request: SavePicksRequest) =>
      api<SitterProofs>(`/proofs/${dayId}/picks`, { method: 'PUT', body: request }),
    onSuccess: (saved) => {
      queryClient.setQueryData(proofsQueryOptions(dayId).queryKey, saved);
      void queryClient.invalidateQueries({ queryKey: ['proofs', 'mine'], exact: true });
    },
  });
}
