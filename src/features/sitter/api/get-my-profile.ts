import { queryOptions, useQuery } from '@tanstack/react-query';
import type { SitterProfile } from '../../../../server/schemas/sitter';
import { api } from '../../../lib/api-client';

export const getMyProfile = () => api<SitterProfile>('/sitters/me');

export const myProfileQueryOptions = () =>
  queryOptions({ queryKey: ['sitters', 'me'], queryFn: getMyProfile });

export const useMyProfile = () => useQuery(myProfileQueryOptions());
