import type { QueryClient } from '@tanstack/react-query';
import { Link, useParams, type LoaderFunctionArgs } from 'react-router-dom';
import { PageHeading } from '../../../components/ui/page-heading';
import { clientsQueryOptions, useClients } from '../../../features/clients/api/list-clients';
import { RosterImportWizard } from '../../../features/roster/components/roster-import-wizard';
import { ImportHistory } from '../../../features/roster/components/import-history';
import { requireRole } from '../../guards';

export const makeLoader =
  (queryClient: QueryClient) =>
  async ({ request, params }: LoaderFunctionArgs) => {
    await requireRole(queryClient, request, ['studio_admin', 'coordinator']);
    const { clients } = await queryClient.ensureQueryData(clientsQueryOptions());
    // Another company's import page is not shown at all (the API refuses it too).
    if (!clients.some((client) => client.id === params.clientId)) {
      throw new Response('That client was not found.', { status: 404 });
    }
    return null;
  };

export function RosterImportPage() {
  const clientId = useParams().clientId ?? '';
  const client = useClients().data?.clients.find((item) => item.id === clientId);
  return (
    <>
      <PageHeading title="Import the staff list">
        {client ? `${client.name}. ` : ''}Nothing changes on the roster until you confirm the last
        step.{' '}
        <Link className="font-medium text-spruce-700 underline" to={`/clients/${clientId}/people`}>
          Back to the people
        </Link>
      </PageHeading>
      <div className="flex flex-col gap-6">
        <RosterImportWizard clientId={clientId} />
        <ImportHistory clientId={clientId} />
      </div>
    </>
  );
}
