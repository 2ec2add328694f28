import { queryOptions, useQuery } from '@tanstack/react-query';
import type { MailingLog } from '../../../../server/schemas/days';
import { api } from '../../../lib/api-client';

export const getMailings = (dayId: string) => api<MailingLog>(`/days/${dayId}/mailings`);

export const mailingsQueryOptions = (dayId: string) =>
  queryOptions({ queryKey: ['days', dayId, 'mailings'], queryFn: () => getMailings(dayId) });

/** Polls every 2 s while anything is still queued, so the progress bar moves. */
export const useMailings = (dayId: string) =>
  useQuery({
    ...mailingsQueryOptions(dayId),
    refetchInterval: (query) => ((query.state.data?.counts.queued ?? 0) > 0 ? 2000 : false),
  });
