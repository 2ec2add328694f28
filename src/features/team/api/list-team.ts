import { queryOptions, useQuery } from '@tanstack/react-query';
import type { StaffUserList } from '../../../../server/schemas/users';
import { api } from '../../../lib/api-client';

export const listTeam = () => api<StaffUserList>('/users');

export const teamQueryOptions = () => queryOptions({ queryKey: ['team'], queryFn: listTeam });

export const useTeam = () => useQuery(teamQueryOptions());
