import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { PriceListAnswer, PriceListInput } from '../../../../server/schemas/invoices';
import { api } from '../../../lib/api-client';
import { priceListQueryOptions } from './get-price-list';

export const savePriceList = (clientId: string, prices: PriceListInput) =>
  api<PriceListAnswer>(`/clients/${clientId}/price-list`, { method: 'PUT', body: prices });

export function useSavePriceList(clientId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (prices: PriceListInput) => savePriceList(clientId, prices),
    onSuccess: async (saved) => {
      queryClient.setQueryData(priceListQueryOptions(clientId).queryKey, saved);
      // Every day's draft invoice follows the prices.
      await queryClient.invalidateQueries({
        predicate: (query) => query.queryKey[2] === 'summary',
      });
    },
  });
}
