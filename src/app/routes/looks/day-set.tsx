import type { QueryClient } from '@tanstack/react-query';
import { Link, useParams, type LoaderFunctionArgs } from 'react-router-dom';
import { Card } from '../../../components/ui/card';
import { PageHeading } from '../../../components/ui/page-heading';
import { useSession } from '../../../features/auth/api/get-session';
import { daySetQueryOptions, useDaySet } from '../../../features/looks/api/looks';
import { DeliveryPanel } from '../../../features/looks/components/delivery-panel';
import { SetGrid } from '../../../features/looks/components/set-grid';
import { requireRole } from '../../guards';

export const makeLoader =
  (queryClient: QueryClient) =>
  async ({ request, params }: LoaderFunctionArgs) => {
    await requireRole(queryClient, request, ['studio_admin', 'photographer']);
    await queryClient.ensureQueryData(daySetQueryOptions(params.dayId ?? ''));
    return null;
  };

/** The day's set: every portrait in every rendition, checked side by side, then released. */
export function DaySetPage() {
  const { dayId = '' } = useParams();
  const { data } = useDaySet(dayId);
  const { data: session } = useSession();
  if (!data) return null;
  return (
    <>
      <PageHeading title="The set">
        {data.clientName} · {data.dayDate} ·{' '}
        <Link to={`/days/${dayId}/retouch`} className="text-spruce-700 underline">
          retouch queue
        </Link>
      </PageHeading>
      <div className="flex flex-col gap-5">
        <Card title="Delivery">
          <DeliveryPanel
            dayId={dayId}
            canRelease
            canDownload={session?.user.role === 'studio_admin'}
          />
        </Card>
        <Card title="Every portrait, every rendition">
          {data.lookVersion === null ? (
            <p>This client has no look yet: the studio admin sets one up on the client’s page.</p>
          ) : (
            <SetGrid set={data} />
          )}
        </Card>
      </div>
    </>
  );
}
