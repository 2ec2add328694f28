import { queryOptions, useQuery } from '@tanstack/react-query';
import type { ClientList } from '../../../../server/schemas/clients';
import { api } from '../../../lib/api-client';

export const listClients = () => api<ClientList>('/clients');

export const clientsQueryOptions = () =>
  queryOptions({ queryKey: ['clients'], queryFn: listClients });

export const useClients = () => useQuery(clientsQueryOptions());
