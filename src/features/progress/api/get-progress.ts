import { queryOptions, useQuery } from '@tanstack/react-query';
import type { DayProgress } from '../../../../server/schemas/days';
import { api } from '../../../lib/api-client';

export const getProgress = (dayId: string) => api<DayProgress>(`/days/${dayId}/progress`);

export const progressQueryOptions = (dayId: string) =>
  queryOptions({ queryKey: ['days', dayId, 'progress'], queryFn: () => getProgress(dayId) });

export const useProgress = (dayId: string) => useQuery(progressQueryOptions(dayId));
