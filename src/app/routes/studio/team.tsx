import type { QueryClient } from '@tanstack/react-query';
import type { LoaderFunctionArgs } from 'react-router-dom';
import { Card } from '../../../components/ui/card';
import { PageHeading } from '../../../components/ui/page-heading';
import { useSession } from '../../../features/auth/api/get-session';
import { clientsQueryOptions } from '../../../features/clients/api/list-clients';
import { teamQueryOptions, useTeam } from '../../../features/team/api/list-team';
import { InviteMemberForm } from '../../../features/team/components/invite-member-form';
import { TeamTable } from '../../../features/team/components/team-table';
import { requireRole } from '../../guards';

export const makeLoader =
  (queryClient: QueryClient) =>
  async ({ request }: LoaderFunctionArgs) => {
    await requireRole(queryClient, request, ['studio_admin']);
    await Promise.all([
      queryClient.ensureQueryData(teamQueryOptions()),
      queryClient.ensureQueryData(clientsQueryOptions()),
    ]);
    return null;
  };

export function TeamPage() {
  const { data } = useTeam();
  const { data: session } = useSession();
  return (
    <>
      <PageHeading title="Team">Studio staff and the coordinators of each client.</PageHeading>
      <div className="grid gap-5 lg:grid-cols-[2fr_1fr]">
        <TeamTable members={data?.users ?? []} viewerId={session?.user.id ?? ''} />
        <Card title="Invite someone">
          <InviteMemberForm />
        </Card>
      </div>
    </>
  );
}
