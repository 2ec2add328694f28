import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { MatchDecisionRequest } from '../../../../server/schemas/matching';
import { api } from '../../../lib/api-client';
import { reviewQueryKey } from './get-review';

export const sendDecision = (dayId: string, request: MatchDecisionRequest) =>
  api<{ changeId: string; frames: number }>(`/days/${dayId}/review/decisions`, {
    method: 'POST',
    body: request,
  });

export const undoLastChange = (dayId: string) =>
  api<{ changeId: string; frames: number }>(`/days/${dayId}/review/undo`, { method: 'POST' });

export const requestMatch = (dayId: string) =>
  api<{ queued: boolean }>(`/days/${dayId}/review/run`, { method: 'POST' });

/** Each change refreshes the review and the frames list, which show the same assignments. */
function useDayMutation<Input, Output>(dayId: string, send: (input: Input) => Promise<Output>) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: send,
    onSettled: async () => {
      await queryClient.invalidateQueries({ queryKey: reviewQueryKey(dayId) });
      await queryClient.invalidateQueries({ queryKey: ['days', dayId, 'frames', 'list'] });
    },
  });
}

export const useDecision = (dayId: string) =>
  useDayMutation(dayId, (request: MatchDecisionRequest) => sendDecision(dayId, request));

export const useUndoLastChange = (dayId: string) =>
  useDayMutation(dayId, () => undoLastChange(dayId));

export const useRequestMatch = (dayId: string) => useDayMutation(dayId, () => requestMatch(dayId));
