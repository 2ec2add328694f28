import { queryOptions, useQuery } from '@tanstack/react-query';
import type { DayChangeProposalList } from '../../../../server/schemas/day-changes';
import { api } from '../../../lib/api-client';

export const listDayProposals = (dayId: string) =>
  api<DayChangeProposalList>(`/days/${dayId}/proposals`);

export const dayProposalsQueryOptions = (dayId: string) =>
  queryOptions({
    queryKey: ['days', dayId, 'proposals'],
    queryFn: () => listDayProposals(dayId),
  });

export const useDayProposals = (dayId: string) => useQuery(dayProposalsQueryOptions(dayId));
