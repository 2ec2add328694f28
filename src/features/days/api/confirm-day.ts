import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { ConfirmDayRequest, Day } from '../../../../server/schemas/days';
import { api } from '../../../lib/api-client';

export const confirmDay = (input: { dayId: string } & ConfirmDayRequest) =>
  api<Day>(`/days/${input.dayId}/confirmation`, {
    method: 'POST',
    body: { stations: input.stations },
  });

export function useConfirmDay() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: confirmDay,
    onSuccess: () => queryClient.invalidateQueries({ queryKey: ['days'] }),
  });
}
