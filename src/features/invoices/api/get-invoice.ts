import { queryOptions, useQuery } from '@tanstack/react-query';
import type { Invoice } from '../../../../server/schemas/invoices';
import { api } from '../../../lib/api-client';

export const getInvoice = (invoiceId: string) => api<Invoice>(`/invoices/${invoiceId}`);

/** An issued invoice never changes, so it is never stale. */
export const invoiceQueryOptions = (invoiceId: string) =>
  queryOptions({
    queryKey: ['invoices', invoiceId],
    queryFn: () => getInvoice(invoiceId),
    staleTime: Infinity,
  });

export const useInvoice = (invoiceId: string) => useQuery(invoiceQueryOptions(invoiceId));
