import { queryOptions, useQuery } from '@tanstack/react-query';
import type { RecordedDay } from '../../../../server/schemas/day-record';
import { api } from '../../../lib/api-client';

export const getRecordedDay = (dayId: string) => api<RecordedDay>(`/days/${dayId}/recorded`);

export const recordedDayQueryOptions = (dayId: string) =>
  queryOptions({ queryKey: ['days', dayId, 'recorded'], queryFn: () => getRecordedDay(dayId) });

export const useRecordedDay = (dayId: string, enabled: boolean) =>
  useQuery({ ...recordedDayQueryOptions(dayId), enabled });
