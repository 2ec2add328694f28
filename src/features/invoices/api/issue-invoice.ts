import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { InvoiceRef } from '../../../../server/schemas/invoices';
import { api } from '../../../lib/api-client';
import { daySummaryQueryOptions } from './get-day-summary';

export const issueInvoice = (dayId: string) =>
  api<{ created: boolean; invoice: InvoiceRef }>(`/days/${dayId}/invoice`, {
    method: 'POST',
    body: {},
  });

export function useIssueInvoice(dayId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: () => issueInvoice(dayId),
    onSuccess: () =>
      queryClient.invalidateQueries({ queryKey: daySummaryQueryOptions(dayId).queryKey }),
  });
}
