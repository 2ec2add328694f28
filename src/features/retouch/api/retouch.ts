import {
  keepPreviousData,
  queryOptions,
  useMutation,
  useQuery,
  useQueryClient,
} from '@tanstack/react-query';
import type { RetouchPage, RetouchStatusName } from '../../../../server/schemas/proofs';
import { api } from '../../../lib/api-client';

export interface RetouchParams {
  stationId?: string;
  status?: RetouchStatusName;
  q?: string;
  sort: 'sitter' | 'station' | 'status' | 'picked';
  dir: 'asc' | 'desc';
  page: number;
  pageSize: number;
}

export const getRetouchPage = (dayId: string, params: RetouchParams) => {
  const search = new URLSearchParams();
  for (const [key, value] of Object.entries(params)) {
    if (value !== undefined && value !== '') search.set(key, String(value));
  }
  return api<RetouchPage>(`/days/${dayId}/retouch?${search.toString()}`);
};

export const retouchQueryOptions = (dayId: string, params: RetouchParams) =>
  queryOptions({
    queryKey: ['days', dayId, 'retouch', params],
    queryFn: () => getRetouchPage(dayId, params),
    placeholderData: keepPreviousData,
  });

export const useRetouchQueue = (dayId: string, params: RetouchParams) =>
  useQuery(retouchQueryOptions(dayId, params));

/** Every pick of the day (all pages), for matching finals by file name. */
export async function allPicks(dayId: string) {
  const rows = [];
  for (let page = 1; ; page += 1) {
    const result = await getRetouchPage(dayId, { sort: 'sitter', dir: 'asc', page, pageSize: 200 });
    rows.push(...result.rows);
    if (rows.length >= result.total || result.rows.length === 0) return rows;
  }
}

export function useUpdatePick(dayId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: { pickId: string; status?: RetouchStatusName; takenByMe?: boolean }) =>
      api(`/picks/${input.pickId}`, {
        method: 'PATCH',
        body: {
          ...(input.status ? { status: input.status } : {}),
          ...(input.takenByMe === undefined ? {} : { takenByMe: input.takenByMe }),
        },
      }),
    onSettled: () => queryClient.invalidateQueries({ queryKey: ['days', dayId, 'retouch'] }),
  });
}
