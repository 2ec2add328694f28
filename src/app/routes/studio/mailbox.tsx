import type { QueryClient } from '@tanstack/react-query';
import { useState } from 'react';
import type { LoaderFunctionArgs } from 'react-router-dom';
import { Card } from '../../../components/ui/card';
import { EmptyState } from '../../../components/ui/empty-state';
import { Notice } from '../../../components/ui/notice';
import { PageHeading } from '../../../components/ui/page-heading';
import { mailboxQueryOptions, useMailbox } from '../../../features/dev-mailbox/api/list-messages';
import { useMessage } from '../../../features/dev-mailbox/api/get-message';
import { MailView } from '../../../features/dev-mailbox/components/mail-view';
import { formatDateTime } from '../../../lib/format';
import { requireRole } from '../../guards';

export const makeLoader =
  (queryClient: QueryClient) =>
  async ({ request }: LoaderFunctionArgs) => {
    await requireRole(queryClient, request, ['studio_admin']);
    await queryClient.prefetchQuery(mailboxQueryOptions());
    return null;
  };

/** Development only: every message the local mail catcher received. */
export function MailboxPage() {
  const mailbox = useMailbox();
  const [openId, setOpenId] = useState<string | null>(null);
  const messages = mailbox.data?.messages ?? [];
  const open = messages.find((message) => message.id === openId) ?? messages[0];
  const opened = useMessage(open?.id);

  return (
    <>
      <PageHeading title="Mailbox">
        Development only: mail is caught here instead of being delivered (and kept across restarts),
        so you can follow every link.
      </PageHeading>
      {mailbox.isError ? <Notice tone="caution">{mailbox.error.message}</Notice> : null}
      {!mailbox.isError && messages.length === 0 ? (
        <EmptyState title="No mail yet">
          Invite someone or ask for a sign-in link, and the message appears here.
        </EmptyState>
      ) : null}
      {messages.length > 0 && open ? (
        <div className="grid gap-5 lg:grid-cols-[1fr_2fr]">
          <ul aria-label="Messages" className="flex flex-col gap-2">
            {messages.map((message) => (
              <li key={message.id}>
                <button
                  type="button"
                  onClick={() => setOpenId(message.id)}
                  aria-current={message.id === open.id ? 'true' : undefined}
                  className={`w-full rounded-control border px-3 py-2 text-left ${
                    message.id === open.id
                      ? 'border-spruce-500 bg-spruce-50'
                      : 'border-line bg-paper-raised'
                  }`}
                >
                  <span className="block font-medium">{message.subject}</span>
                  <span className="block text-sm text-ink-muted">
                    To {message.to.join(', ')} · {formatDateTime(message.receivedAt)}
                  </span>
                </button>
              </li>
            ))}
          </ul>
          <Card title={open.subject}>
            {opened.isError ? <Notice tone="caution">{opened.error.message}</Notice> : null}
            {opened.data ? <MailView key={opened.data.id} message={opened.data} /> : null}
          </Card>
        </div>
      ) : null}
    </>
  );
}
