import { queryOptions, useQuery } from '@tanstack/react-query';
import type { DaySchedule } from '../../../../server/schemas/days';
import { api } from '../../../lib/api-client';

export const getSchedule = (dayId: string) => api<DaySchedule>(`/days/${dayId}/schedule`);

export const scheduleQueryOptions = (dayId: string) =>
  queryOptions({ queryKey: ['days', dayId, 'schedule'], queryFn: () => getSchedule(dayId) });

export const useSchedule = (dayId: string) => useQuery(scheduleQueryOptions(dayId));
