import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { InviteStaffRequest, StaffUser } from '../../../../server/schemas/users';
import { api } from '../../../lib/api-client';
import { clientsQueryOptions } from '../../clients/api/list-clients';
import { teamQueryOptions } from './list-team';

export const inviteMember = (input: InviteStaffRequest) =>
  api<StaffUser>('/users', { method: 'POST', body: input });

export function useInviteMember() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: inviteMember,
    onSuccess: async () => {
      await queryClient.invalidateQueries({ queryKey: teamQueryOptions().queryKey });
      await queryClient.invalidateQueries({ queryKey: clientsQueryOptions().queryKey });
    },
  });
}
