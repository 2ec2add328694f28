import { queryOptions, useQuery } from '@tanstack/react-query';
import type { ConsoleDay } from '../../../../server/schemas/console';
import { api } from '../../../lib/api-client';

export const getConsoleDays = () => api<{ days: ConsoleDay[] }>('/console/days');

export const consoleDaysQueryOptions = () =>
  queryOptions({ queryKey: ['console', 'days'], queryFn: getConsoleDays });

export const useConsoleDays = () => useQuery(consoleDaysQueryOptions());
