import { queryOptions, useQuery } from '@tanstack/react-query';
import type { DaySummary } from '../../../../server/schemas/invoices';
import { api } from '../../../lib/api-client';

export const getDaySummary = (dayId: string) => api<DaySummary>(`/days/${dayId}/summary`);

export const daySummaryQueryOptions = (dayId: string) =>
  queryOptions({ queryKey: ['days', dayId, 'summary'], queryFn: () => getDaySummary(dayId) });

export const useDaySummary = (dayId: string) => useQuery(daySummaryQueryOptions(dayId));
