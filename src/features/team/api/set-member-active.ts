import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { StaffUser } from '../../../../server/schemas/users';
import { api } from '../../../lib/api-client';
import { teamQueryOptions } from './list-team';

export const setMemberActive = ({ id, active }: { id: string; active: boolean }) =>
  api<StaffUser>(`/users/${id}`, { method: 'PATCH', body: { active } });

export function useSetMemberActive() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: setMemberActive,
    onSuccess: () => queryClient.invalidateQueries({ queryKey: teamQueryOptions().queryKey }),
  });
}
