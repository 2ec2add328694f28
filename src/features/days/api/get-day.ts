import { queryOptions, useQuery } from '@tanstack/react-query';
import type { Day } from '../../../../server/schemas/days';
import { api } from '../../../lib/api-client';

export const getDay = (dayId: string) => api<Day>(`/days/${dayId}`);

export const dayQueryOptions = (dayId: string) =>
  queryOptions({ queryKey: ['days', dayId], queryFn: () => getDay(dayId) });

export const useDay = (dayId: string) => useQuery(dayQueryOptions(dayId));
