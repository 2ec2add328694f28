import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { SessionResponse, SetPasswordRequest } from '../../../../server/schemas/auth';
import { api } from '../../../lib/api-client';
import { sessionQueryOptions } from './get-session';

export const setPassword = (input: SetPasswordRequest) =>
  api<SessionResponse>('/passwords', { method: 'POST', body: input });

export function useSetPassword() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: setPassword,
    onSuccess: (session) => {
      queryClient.clear();
      queryClient.setQueryData(sessionQueryOptions().queryKey, session);
    },
  });
}
