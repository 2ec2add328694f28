import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { DayChangeProposalList } from '../../../../server/schemas/day-changes';
import { api } from '../../../lib/api-client';

export const declineDayProposal = (input: { dayId: string; proposalId: string }) =>
  api<DayChangeProposalList>(`/days/${input.dayId}/proposals/${input.proposalId}/decline`, {
    method: 'POST',
  });

export function useDeclineDayProposal() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: declineDayProposal,
    onSuccess: (_result, input) =>
      queryClient.invalidateQueries({ queryKey: ['days', input.dayId, 'proposals'] }),
  });
}
