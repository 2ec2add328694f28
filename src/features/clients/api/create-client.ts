import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { Client, CreateClientRequest } from '../../../../server/schemas/clients';
import { api } from '../../../lib/api-client';
import { clientsQueryOptions } from './list-clients';

export const createClient = (input: CreateClientRequest) =>
  api<Client>('/clients', { method: 'POST', body: input });

export function useCreateClient() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: createClient,
    onSuccess: () => queryClient.invalidateQueries({ queryKey: clientsQueryOptions().queryKey }),
  });
}
