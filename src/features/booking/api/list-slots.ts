import { queryOptions, useQuery } from '@tanstack/react-query';
import type { SlotList } from '../../../../server/schemas/days';
import { api } from '../../../lib/api-client';

export const listSlots = (dayId: string) => api<SlotList>(`/days/${dayId}/slots`);

export const slotsQueryOptions = (dayId: string) =>
  queryOptions({ queryKey: ['days', dayId, 'slots'], queryFn: () => listSlots(dayId) });

export const useSlots = (dayId: string, enabled = true) =>
  useQuery({ ...slotsQueryOptions(dayId), enabled });
