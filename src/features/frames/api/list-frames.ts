import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import type { FramePage } from '../../../../server/schemas/frames';
import { api } from '../../../lib/api-client';

export interface FrameListParams {
  stationId?: string;
  page: number;
  pageSize: number;
}

export const listFrames = (dayId: string, params: FrameListParams) => {
  const search = new URLSearchParams({
    page: String(params.page),
    pageSize: String(params.pageSize),
  });
  if (params.stationId) search.set('stationId', params.stationId);
  return api<FramePage>(`/days/${dayId}/frames?${search.toString()}`);
};

export const framesQueryOptions = (dayId: string, params: FrameListParams) =>
  queryOptions({
    queryKey: ['days', dayId, 'frames', 'list', params],
    queryFn: () => listFrames(dayId, params),
    placeholderData: keepPreviousData,
  });

export const useFrames = (dayId: string, params: FrameListParams, refetchMs: number | false) =>
  useQuery({ ...framesQueryOptions(dayId, params), refetchInterval: refetchMs });
