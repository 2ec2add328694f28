import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import type { RosterMatch } from '../../../../server/schemas/console';
import { api } from '../../../lib/api-client';

export const searchRoster = (dayId: string, text: string) =>
  api<{ people: RosterMatch[] }>(
    `/days/${dayId}/console/roster?q=${encodeURIComponent(text.trim())}`,
  );

export const rosterSearchQueryOptions = (dayId: string, text: string) =>
  queryOptions({
    queryKey: ['console', 'days', dayId, 'roster', text.trim().toLowerCase()],
    queryFn: () => searchRoster(dayId, text),
    enabled: text.trim().length >= 2,
    placeholderData: keepPreviousData,
  });

export const useRosterSearch = (dayId: string, text: string) =>
  useQuery(rosterSearchQueryOptions(dayId, text));
