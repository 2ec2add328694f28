import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { CreateDayRequest, Day } from '../../../../server/schemas/days';
import { api } from '../../../lib/api-client';

export const createDay = (input: CreateDayRequest) =>
  api<Day>('/days', { method: 'POST', body: input });

export function useCreateDay() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: createDay,
    onSuccess: () => queryClient.invalidateQueries({ queryKey: ['days'] }),
  });
}
