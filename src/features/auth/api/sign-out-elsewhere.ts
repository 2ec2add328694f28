import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import { sessionsQueryOptions } from './list-sessions';

/** Ends every other session of the signed-in person; this one stays. */
export const signOutElsewhere = () => api<{ ended: number }>('/sessions', { method: 'DELETE' });

export function useSignOutElsewhere() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: signOutElsewhere,
    onSuccess: () => queryClient.invalidateQueries({ queryKey: sessionsQueryOptions().queryKey }),
  });
}
