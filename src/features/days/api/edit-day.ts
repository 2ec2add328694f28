import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { DayChangeResult, EditDayRequest } from '../../../../server/schemas/day-changes';
import { api } from '../../../lib/api-client';

export const editDay = (input: { dayId: string } & EditDayRequest) =>
  api<DayChangeResult>(`/days/${input.dayId}`, {
    method: 'PATCH',
    body: { changes: input.changes, proposalId: input.proposalId },
  });

export function useEditDay() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: editDay,
    // The day, its slots, bookings, progress and proposals all change with it.
    onSuccess: (_result, input) =>
      queryClient.invalidateQueries({ queryKey: ['days', input.dayId] }),
  });
}
