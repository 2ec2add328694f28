import { queryOptions, useQuery } from '@tanstack/react-query';
import type { DayFramesOverview } from '../../../../server/schemas/frames';
import { api } from '../../../lib/api-client';

export const getFramesOverview = (dayId: string) =>
  api<DayFramesOverview>(`/days/${dayId}/frames/overview`);

export const framesOverviewQueryOptions = (dayId: string) =>
  queryOptions({
    queryKey: ['days', dayId, 'frames', 'overview'],
    queryFn: () => getFramesOverview(dayId),
    // While frames wait to be read the counts move: look again every two seconds.
    refetchInterval: (query) =>
      query.state.data?.stations.some((station) => station.waiting + station.reading > 0)
        ? 2000
        : false,
  });

export const useFramesOverview = (dayId: string) => useQuery(framesOverviewQueryOptions(dayId));
