import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { SessionResponse, SignInRequest } from '../../../../server/schemas/auth';
import { api } from '../../../lib/api-client';
import { sessionQueryOptions } from './get-session';

export const signIn = (input: SignInRequest) =>
  api<SessionResponse>('/session', { method: 'POST', body: input });

export function useSignIn() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: signIn,
    onSuccess: (session) => {
      // Whatever was cached belonged to the previous viewer.
      queryClient.clear();
      queryClient.setQueryData(sessionQueryOptions().queryKey, session);
    },
  });
}
