import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { Person } from '../../../../server/schemas/people';
import { api } from '../../../lib/api-client';

export const setPersonActive = (input: { clientId: string; personId: string; active: boolean }) =>
  api<Person>(`/clients/${input.clientId}/people/${input.personId}`, {
    method: 'PATCH',
    body: { active: input.active },
  });

export function useSetPersonActive() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: setPersonActive,
    onSuccess: () => queryClient.invalidateQueries({ queryKey: ['people'] }),
  });
}
