import { queryOptions, useQuery } from '@tanstack/react-query';
import type { MailboxList } from '../../../../server/schemas/mailbox';
import { api } from '../../../lib/api-client';

export const listMessages = () => api<MailboxList>('/dev/mailbox');

export const mailboxQueryOptions = () =>
  queryOptions({ queryKey: ['dev-mailbox'], queryFn: listMessages, refetchInterval: 3000 });

export const useMailbox = () => useQuery(mailboxQueryOptions());
