import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';

export const erasePerson = (input: { clientId: string; personId: string; confirmEmail: string }) =>
  api<void>(`/clients/${input.clientId}/people/${input.personId}/erasure`, {
    method: 'POST',
    body: { confirmEmail: input.confirmEmail },
  });

export function useErasePerson() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: erasePerson,
    onSuccess: () => queryClient.invalidateQueries({ queryKey: ['people'] }),
  });
}
