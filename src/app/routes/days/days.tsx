import type { QueryClient } from '@tanstack/react-query';
import { useQuery } from '@tanstack/react-query';
import type { LoaderFunctionArgs } from 'react-router-dom';
import { Card } from '../../../components/ui/card';
import { PageHeading } from '../../../components/ui/page-heading';
import { useSession } from '../../../features/auth/api/get-session';
import { clientsQueryOptions, useClients } from '../../../features/clients/api/list-clients';
import { daysQueryOptions, useDays } from '../../../features/days/api/list-days';
import { DayForm } from '../../../features/days/components/day-form';
import { DaysList } from '../../../features/days/components/days-list';
import { ClientProgressCard } from '../../../features/progress/components/client-progress';
import { teamQueryOptions } from '../../../features/team/api/list-team';
import { requireRole } from '../../guards';

export const makeLoader =
  (queryClient: QueryClient) =>
  async ({ request }: LoaderFunctionArgs) => {
    const session = await requireRole(queryClient, request, ['studio_admin', 'coordinator']);
    await Promise.all([
      queryClient.ensureQueryData(daysQueryOptions()),
      queryClient.ensureQueryData(clientsQueryOptions()),
      session.user.role === 'studio_admin' ? queryClient.ensureQueryData(teamQueryOptions()) : null,
    ]);
    return null;
  };

export function DaysPage() {
  const { data: session } = useSession();
  const isStudio = session?.user.role === 'studio_admin';
  const days = useDays();
  const clients = useClients();
  const team = useQuery({ ...teamQueryOptions(), enabled: isStudio });
  const photographers = isStudio
    ? (team.data?.users ?? []).filter((user) => user.role === 'photographer' && user.active)
    : null;
  return (
    <>
      <PageHeading title="Shoot days">
        {isStudio
          ? 'Each day belongs to one office, with stations run by your photographers.'
          : 'Your company’s portrait days. Propose a day; the studio confirms it.'}
      </PageHeading>
      <div className="grid gap-5 lg:grid-cols-[1fr_1fr]">
        <div className="flex flex-col gap-5">
          {(clients.data?.clients ?? []).map((client) => (
            <ClientProgressCard key={client.id} clientId={client.id} clientName={client.name} />
          ))}
          <DaysList
            days={days.data?.days ?? []}
            emptyHint={
              isStudio
                ? 'Plan the first day with the form on this page.'
                : 'Propose a day with the form on this page, or wait for the studio to plan one.'
            }
          />
        </div>
        <Card title={isStudio ? 'Plan a shoot day' : 'Propose a shoot day'}>
          <DayForm clients={clients.data?.clients ?? []} photographers={photographers} />
        </Card>
      </div>
    </>
  );
}
