import { queryOptions, useQuery } from '@tanstack/react-query';
import type { CardSourceList } from '../../../../server/schemas/setup-card';
import { api } from '../../../lib/api-client';

export const listCardSources = () => api<CardSourceList>('/setup-card-sources');

export const cardSourcesQueryOptions = () =>
  queryOptions({ queryKey: ['setup-card-sources'], queryFn: listCardSources });

export const useCardSources = () => useQuery(cardSourcesQueryOptions());
