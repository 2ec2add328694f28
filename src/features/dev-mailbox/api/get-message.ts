import { queryOptions, useQuery } from '@tanstack/react-query';
import type { CaughtMailMessage } from '../../../../server/schemas/mailbox';
import { api } from '../../../lib/api-client';

export const getMessage = (messageId: string) =>
  api<CaughtMailMessage>(`/dev/mailbox/${encodeURIComponent(messageId)}`);

export const messageQueryOptions = (messageId: string) =>
  queryOptions({
    queryKey: ['dev-mailbox', 'message', messageId],
    queryFn: () => getMessage(messageId),
    // A caught message never changes.
    staleTime: Infinity,
  });

export const useMessage = (messageId: string | undefined) =>
  useQuery({ ...messageQueryOptions(messageId ?? ''), enabled: Boolean(messageId) });

/** Where a caught file downloads from (also the source of an image's preview). */
export const attachmentUrl = (messageId: string, index: number) =>
  `/api/dev/mailbox/${encodeURIComponent(messageId)}/attachments/${index}`;
