import { useMutation, useQueryClient } from '@tanstack/react-query';
import type {
  DayChangeProposal,
  ProposeDayChangeRequest,
} from '../../../../server/schemas/day-changes';
import { api } from '../../../lib/api-client';

export const proposeDayChange = (input: { dayId: string; proposal: ProposeDayChangeRequest }) =>
  api<DayChangeProposal>(`/days/${input.dayId}/proposals`, {
    method: 'POST',
    body: input.proposal,
  });

export function useProposeDayChange() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: proposeDayChange,
    onSuccess: (_result, input) =>
      queryClient.invalidateQueries({ queryKey: ['days', input.dayId, 'proposals'] }),
  });
}
