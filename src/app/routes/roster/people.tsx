import type { QueryClient } from '@tanstack/react-query';
import { useParams, type LoaderFunctionArgs } from 'react-router-dom';
import { PageHeading } from '../../../components/ui/page-heading';
import { useClients, clientsQueryOptions } from '../../../features/clients/api/list-clients';
import { peopleQueryOptions } from '../../../features/people/api/list-people';
import { PeopleDirectory } from '../../../features/people/components/people-directory';
import { requireRole } from '../../guards';

/** The first page the directory shows, fetched by the loader so the table appears at once. */
const firstPage = {
  q: '',
  officeId: '',
  department: '',
  status: 'active',
  booking: 'any',
  sort: 'name',
  direction: 'asc',
  page: 1,
  pageSize: 25,
} as const;

export const makeLoader =
  (queryClient: QueryClient) =>
  async ({ request, params }: LoaderFunctionArgs) => {
    await requireRole(queryClient, request, ['studio_admin', 'coordinator']);
    const clientId = params.clientId ?? '';
    await Promise.all([
      queryClient.ensureQueryData(clientsQueryOptions()),
      queryClient.ensureQueryData(peopleQueryOptions(clientId, firstPage)),
    ]);
    return null;
  };

export function PeoplePage() {
  const clientId = useParams().clientId ?? '';
  const client = useClients().data?.clients.find((item) => item.id === clientId);
  return (
    <>
      <PageHeading title="People">
        {client ? `${client.name}: the staff on the roster.` : 'The staff on the roster.'}
      </PageHeading>
      <PeopleDirectory clientId={clientId} offices={client?.offices ?? []} />
    </>
  );
}
