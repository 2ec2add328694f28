import type { QueryClient } from '@tanstack/react-query';
import type { LoaderFunctionArgs } from 'react-router-dom';
import { PageHeading } from '../../components/ui/page-heading';
import { sessionsQueryOptions } from '../../features/auth/api/list-sessions';
import { SessionList } from '../../features/auth/components/session-list';
import { requireSession } from '../guards';

export const makeLoader =
  (queryClient: QueryClient) =>
  async ({ request }: LoaderFunctionArgs) => {
    await requireSession(queryClient, request);
    await queryClient.prefetchQuery(sessionsQueryOptions());
    return null;
  };

export function AccountPage() {
  return (
    <>
      <PageHeading title="Your account">
        A lost tablet or a shared computer: sign it out from here.
      </PageHeading>
      <SessionList />
    </>
  );
}
