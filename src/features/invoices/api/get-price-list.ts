import { queryOptions, useQuery } from '@tanstack/react-query';
import type { PriceListAnswer } from '../../../../server/schemas/invoices';
import { api } from '../../../lib/api-client';

export const getPriceList = (clientId: string) =>
  api<PriceListAnswer>(`/clients/${clientId}/price-list`);

export const priceListQueryOptions = (clientId: string) =>
  queryOptions({
    queryKey: ['clients', clientId, 'price-list'],
    queryFn: () => getPriceList(clientId),
  });

export const usePriceList = (clientId: string) => useQuery(priceListQueryOptions(clientId));
