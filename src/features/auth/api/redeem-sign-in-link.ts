import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { SessionResponse } from '../../../../server/schemas/auth';
import { api } from '../../../lib/api-client';
import { sessionQueryOptions } from './get-session';

export const redeemSignInLink = (token: string) =>
  api<SessionResponse>('/sign-in-links/redeem', { method: 'POST', body: { token } });

export function useRedeemSignInLink() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: redeemSignInLink,
    onSuccess: (session) => {
      queryClient.clear();
      queryClient.setQueryData(sessionQueryOptions().queryKey, session);
    },
  });
}
