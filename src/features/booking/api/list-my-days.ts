import { queryOptions, useQuery } from '@tanstack/react-query';
import type { SitterDayList } from '../../../../server/schemas/booking';
import { api } from '../../../lib/api-client';

export const listMyDays = () => api<SitterDayList>('/sitters/me/days');

export const myDaysQueryOptions = () =>
  queryOptions({ queryKey: ['sitters', 'me', 'days'], queryFn: listMyDays });

export const useMyDays = () => useQuery(myDaysQueryOptions());
