import type { QueryClient } from '@tanstack/react-query';
import { Link, type LoaderFunctionArgs } from 'react-router-dom';
import { Card } from '../../../components/ui/card';
import { EmptyState } from '../../../components/ui/empty-state';
import { PackageSettings } from '../../../features/proofs/components/package-settings';
import { PageHeading } from '../../../components/ui/page-heading';
import { clientsQueryOptions, useClients } from '../../../features/clients/api/list-clients';
import { CreateClientForm } from '../../../features/clients/components/create-client-form';
import { PriceListForm } from '../../../features/invoices/components/price-list-form';
import { plural } from '../../../lib/format';
import { requireRole } from '../../guards';

export const makeLoader =
  (queryClient: QueryClient) =>
  async ({ request }: LoaderFunctionArgs) => {
    await requireRole(queryClient, request, ['studio_admin']);
    await queryClient.ensureQueryData(clientsQueryOptions());
    return null;
  };

export function ClientsPage() {
  const { data } = useClients();
  const clients = data?.clients ?? [];
  return (
    <>
      <PageHeading title="Clients">The companies whose staff the studio photographs.</PageHeading>
      <div className="grid gap-5 lg:grid-cols-[2fr_1fr]">
        <div className="flex flex-col gap-4">
          {clients.length === 0 ? (
            <EmptyState title="No clients yet">
              Add the first company with the form on this page.
            </EmptyState>
          ) : (
            clients.map((client) => (
              <Card key={client.id} title={client.name}>
                <p className="text-sm text-ink-muted">
                  {plural(client.activePeople, 'person', 'people')} on the roster ·{' '}
                  {plural(client.coordinators, 'coordinator')} ·{' '}
                  <Link
                    className="font-medium text-spruce-700 underline"
                    to={`/clients/${client.id}/people`}
                  >
                    People and roster import
                  </Link>{' '}
                  ·{' '}
                  <Link
                    className="font-medium text-spruce-700 underline"
                    to={`/clients/${client.id}/look`}
                  >
                    Look and file names
                  </Link>{' '}
                  ·{' '}
                  <Link
                    className="font-medium text-spruce-700 underline"
                    to={`/clients/${client.id}/summary`}
                  >
                    Summary of all days
                  </Link>
                </p>
                {client.offices.length > 0 ? (
                  <ul className="mt-2 flex flex-wrap gap-2">
                    {client.offices.map((office) => (
                      <li
                        key={office.id}
                        className="rounded-control bg-paper-sunk px-2 py-1 text-sm"
                      >
                        {office.name} · {office.timeZone} · {office.activePeople}
                      </li>
                    ))}
                  </ul>
                ) : (
                  <p className="mt-2 text-sm">No offices yet: they come with the roster.</p>
                )}
                <details className="mt-3">
                  <summary className="cursor-pointer text-sm font-medium text-spruce-700">
                    Portrait package
                  </summary>
                  <PackageSettings clientId={client.id} />
                </details>
                <details className="mt-3">
                  <summary className="cursor-pointer text-sm font-medium text-spruce-700">
                    Price list
                  </summary>
                  <PriceListForm clientId={client.id} />
                </details>
              </Card>
            ))
          )}
        </div>
        <Card title="Add a client">
          <CreateClientForm />
        </Card>
      </div>
    </>
  );
}
