import { queryOptions, useQuery } from '@tanstack/react-query';
import type { DaySetupCards } from '../../../../server/schemas/setup-card';
import { api } from '../../../lib/api-client';

export const getDaySetupCards = (dayId: string) => api<DaySetupCards>(`/days/${dayId}/setup-cards`);

export const daySetupCardsQueryOptions = (dayId: string) =>
  queryOptions({
    queryKey: ['days', dayId, 'setup-cards'],
    queryFn: () => getDaySetupCards(dayId),
  });

export const useDaySetupCards = (dayId: string) => useQuery(daySetupCardsQueryOptions(dayId));
