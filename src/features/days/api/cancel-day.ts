import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { CancelDayRequest, DayChangeResult } from '../../../../server/schemas/day-changes';
import { api } from '../../../lib/api-client';

export const cancelDay = (input: { dayId: string } & CancelDayRequest) =>
  api<DayChangeResult>(`/days/${input.dayId}/cancellation`, {
    method: 'POST',
    body: { reason: input.reason, proposalId: input.proposalId },
  });

export function useCancelDay() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: cancelDay,
    onSuccess: () => queryClient.invalidateQueries({ queryKey: ['days'] }),
  });
}
