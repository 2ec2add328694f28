import { Link } from 'react-router-dom';
import { Card } from '../../../components/ui/card';
import { EmptyState } from '../../../components/ui/empty-state';
import { PageHeading } from '../../../components/ui/page-heading';
import { plural } from '../../../lib/format';
import { useClients } from '../api/list-clients';

/** Active people on no office's line: the total counts them, the office lines do not. */
const withoutOffice = (client: {
  activePeople: number;
  offices: ReadonlyArray<{ activePeople: number }>;
}) => client.activePeople - client.offices.reduce((sum, office) => sum + office.activePeople, 0);

export function CoordinatorHome({ name }: { name: string }) {
  const clients = useClients();
  const client = clients.data?.clients[0];

  return (
    <>
      <PageHeading title={`Welcome, ${name.split(' ')[0]}`}>
        {client ? `Portrait day planning for ${client.name}.` : 'Loading your company…'}
      </PageHeading>
      {client ? (
        <div className="grid gap-5 md:grid-cols-2">
          <Card title="Your roster">
            {client.activePeople === 0 ? (
              <EmptyState title="Nobody is on the roster yet">
                Your staff list is the first step: every booking invitation goes to the people on
                it.{' '}
                <Link
                  className="font-medium text-spruce-700 underline"
                  to={`/clients/${client.id}/people/import`}
                >
                  Import the staff list (CSV)
                </Link>
              </EmptyState>
            ) : (
              <>
                <p className="mb-3">
                  {plural(client.activePeople, 'person', 'people')} across{' '}
                  {plural(client.offices.length, 'office')}.
                </p>
                <ul className="flex flex-col divide-y divide-line">
                  {client.offices.map((office) => (
                    <li key={office.id} className="flex justify-between py-2">
                      <span>
                        <span className="font-medium">{office.name}</span>{' '}
                        <span className="text-sm text-ink-muted">({office.timeZone})</span>
                      </span>
                      <span>{plural(office.activePeople, 'person', 'people')}</span>
                    </li>
                  ))}
                  {withoutOffice(client) > 0 ? (
                    // So the lines add up to the total above.
                    <li className="flex justify-between py-2">
                      <span className="text-ink-muted">No office given</span>
                      <span>{plural(withoutOffice(client), 'person', 'people')}</span>
                    </li>
                  ) : null}
                </ul>
                <p className="mt-3 flex flex-wrap gap-4">
                  <Link
                    className="font-medium text-spruce-700 underline"
                    to={`/clients/${client.id}/people`}
                  >
                    See and edit the people
                  </Link>
                  <Link
                    className="font-medium text-spruce-700 underline"
                    to={`/clients/${client.id}/people/import`}
                  >
                    Import a newer staff list
                  </Link>
                  <Link
                    className="font-medium text-spruce-700 underline"
                    to={`/clients/${client.id}/summary`}
                  >
                    Summary of all days
                  </Link>
                  <Link
                    className="font-medium text-spruce-700 underline"
                    to={`/clients/${client.id}/look`}
                  >
                    How the portraits are framed and named
                  </Link>
                </p>
              </>
            )}
          </Card>
          <Card title="What happens next">
            <p className="text-ink-muted">
              The studio schedules a shoot day for each office (you can propose one). Everyone
              invited then gets an e-mail with a personal link to book a five-minute slot.
            </p>
            <Link to="/days" className="mt-3 inline-block font-medium text-spruce-700 underline">
              Shoot days and booking progress
            </Link>
          </Card>
        </div>
      ) : null}
    </>
  );
}
