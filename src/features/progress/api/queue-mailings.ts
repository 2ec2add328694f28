import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { QueuedMailings } from '../../../../server/schemas/days';
import { api } from '../../../lib/api-client';

export const queueMailings = (input: { dayId: string; kind: 'invitations' | 'reminders' }) =>
  api<QueuedMailings>(`/days/${input.dayId}/${input.kind}`, { method: 'POST' });

export function useQueueMailings() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: queueMailings,
    onSuccess: (_result, input) =>
      queryClient.invalidateQueries({ queryKey: ['days', input.dayId, 'mailings'] }),
  });
}
