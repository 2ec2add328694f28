import { Link } from 'react-router-dom';
import { Card } from '../../../components/ui/card';
import { NextSteps } from '../../../components/ui/next-steps';
import { PageHeading } from '../../../components/ui/page-heading';
import { plural } from '../../../lib/format';
import { useTeam } from '../../team/api/list-team';
import { useClients } from '../api/list-clients';

export function StudioHome({ name }: { name: string }) {
  const clients = useClients();
  const team = useTeam();
  const clientList = clients.data?.clients ?? [];
  const members = team.data?.users ?? [];
  const photographers = members.filter((member) => member.role === 'photographer' && member.active);

  return (
    <>
      <PageHeading title={`Good to see you, ${name.split(' ')[0]}`}>
        The studio at a glance.
      </PageHeading>
      <div className="grid gap-5 md:grid-cols-2">
        <Card title="Next steps">
          <NextSteps
            steps={[
              {
                label: 'Add a client company',
                detail: 'Each client gets its own roster, offices and coordinator.',
                to: '/studio/clients',
                done: clientList.length > 0,
              },
              {
                label: "Invite each client's coordinator",
                detail: 'They import the staff list and follow bookings for their company.',
                to: '/studio/team',
                done:
                  clientList.length > 0 && clientList.every((client) => client.coordinators > 0),
              },
              {
                label: 'Invite your photographers',
                detail: 'They run a station on the day and see the days they are assigned to.',
                to: '/studio/team',
                done: photographers.length > 0,
              },
            ]}
          />
        </Card>
        <Card title="Clients">
          {clientList.length === 0 ? (
            <p className="text-ink-muted">No clients yet.</p>
          ) : (
            <ul className="flex flex-col divide-y divide-line">
              {clientList.map((client) => (
                <li key={client.id} className="py-2">
                  <p className="font-medium">{client.name}</p>
                  <p className="text-sm text-ink-muted">
                    {plural(client.activePeople, 'person', 'people')} on the roster ·{' '}
                    {plural(client.offices.length, 'office')} ·{' '}
                    {plural(client.coordinators, 'coordinator')}
                  </p>
                </li>
              ))}
            </ul>
          )}
          <Link
            to="/studio/clients"
            className="mt-3 inline-block font-medium text-spruce-700 underline"
          >
            Manage clients
          </Link>
        </Card>
      </div>
    </>
  );
}
