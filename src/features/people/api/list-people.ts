import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import type { PeoplePage, PeopleQuery } from '../../../../server/schemas/people';
import { api } from '../../../lib/api-client';

export const peopleSearch = (query: PeopleQuery) =>
  new URLSearchParams(
    Object.entries(query)
      .filter(([, value]) => value !== undefined && value !== '')
      .map(([key, value]) => [key, String(value)]),
  ).toString();

export const listPeople = (clientId: string, query: PeopleQuery) =>
  api<PeoplePage>(`/clients/${clientId}/people?${peopleSearch(query)}`);

export const peopleQueryOptions = (clientId: string, query: PeopleQuery) =>
  queryOptions({
    queryKey: ['people', clientId, query],
    queryFn: () => listPeople(clientId, query),
    placeholderData: keepPreviousData,
  });

export const usePeople = (clientId: string, query: PeopleQuery) =>
  useQuery(peopleQueryOptions(clientId, query));
