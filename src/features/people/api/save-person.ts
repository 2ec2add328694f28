import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { Person } from '../../../../server/schemas/people';
import type { SavePersonRequest } from '../../../../server/schemas/roster';
import { api } from '../../../lib/api-client';

/** Adds a person (no id) or saves the edit form of one. */
export const savePerson = (input: {
  clientId: string;
  personId?: string;
  values: SavePersonRequest;
}) =>
  input.personId
    ? api<Person>(`/clients/${input.clientId}/people/${input.personId}`, {
        method: 'PATCH',
        body: input.values,
      })
    : api<Person>(`/clients/${input.clientId}/people`, { method: 'POST', body: input.values });

export function useSavePerson() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: savePerson,
    onSuccess: () => queryClient.invalidateQueries({ queryKey: ['people'] }),
  });
}
