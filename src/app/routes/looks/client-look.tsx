import type { QueryClient } from '@tanstack/react-query';
import { useParams, type LoaderFunctionArgs } from 'react-router-dom';
import { PageHeading } from '../../../components/ui/page-heading';
import { useSession } from '../../../features/auth/api/get-session';
import { lookQueryOptions, useLook } from '../../../features/looks/api/looks';
import { LookEditor } from '../../../features/looks/components/look-editor';
import { requireRole } from '../../guards';

export const makeLoader =
  (queryClient: QueryClient) =>
  async ({ request, params }: LoaderFunctionArgs) => {
    await requireRole(queryClient, request, ['studio_admin', 'coordinator']);
    await queryClient.ensureQueryData(lookQueryOptions(params.clientId ?? ''));
    return null;
  };

/** The client's look: studio admin edits, the client's coordinator views. */
export function ClientLookPage() {
  const { clientId = '' } = useParams();
  const { data } = useLook(clientId);
  const { data: session } = useSession();
  if (!data) return null;
  return (
    <>
      <PageHeading title="Look">
        How every delivered portrait of this client is framed and named. Each preset value shows
        where it comes from.
      </PageHeading>
      <LookEditor clientId={clientId} data={data} canEdit={session?.user.role === 'studio_admin'} />
    </>
  );
}
