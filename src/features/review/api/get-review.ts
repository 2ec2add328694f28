import { queryOptions, useQuery } from '@tanstack/react-query';
import type { DayReview } from '../../../../server/schemas/matching';
import { api } from '../../../lib/api-client';

export const getReview = (dayId: string) => api<DayReview>(`/days/${dayId}/review`);

export const reviewQueryKey = (dayId: string) => ['days', dayId, 'review'] as const;

export const reviewQueryOptions = (dayId: string) =>
  queryOptions({
    queryKey: reviewQueryKey(dayId),
    queryFn: () => getReview(dayId),
    // While a match runs, or frames still wait to be read, look again every two seconds.
    refetchInterval: (query) =>
      query.state.data && (query.state.data.matching || query.state.data.counts.notReadYet > 0)
        ? 2000
        : false,
  });

export const useReview = (dayId: string) => useQuery(reviewQueryOptions(dayId));
