import { queryOptions, useQuery } from '@tanstack/react-query';
import type { DayList } from '../../../../server/schemas/days';
import { api } from '../../../lib/api-client';

export const listDays = () => api<DayList>('/days');

export const daysQueryOptions = () =>
  queryOptions({ queryKey: ['days', 'list'], queryFn: listDays });

export const useDays = () => useQuery(daysQueryOptions());
