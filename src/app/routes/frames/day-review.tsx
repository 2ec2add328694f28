import type { QueryClient } from '@tanstack/react-query';
import { Link, useParams, type LoaderFunctionArgs } from 'react-router-dom';
import { Card } from '../../../components/ui/card';
import { PageHeading } from '../../../components/ui/page-heading';
import { ProofsPanel } from '../../../features/proofs/components/proofs-panel';
import { reviewQueryOptions, useReview } from '../../../features/review/api/get-review';
import { ReviewScreen } from '../../../features/review/components/review-screen';
import { requireRole } from '../../guards';

export const makeLoader =
  (queryClient: QueryClient) =>
  async ({ request, params }: LoaderFunctionArgs) => {
    await requireRole(queryClient, request, ['studio_admin', 'photographer']);
    await queryClient.ensureQueryData(reviewQueryOptions(params.dayId ?? ''));
    return null;
  };

/** After upload: who is in each frame, with the doubts to settle by hand. */
export function DayReviewPage() {
  const { dayId = '' } = useParams();
  const { data } = useReview(dayId);
  if (!data) return null;
  return (
    <>
      <PageHeading title="Frames by sitter">
        {data.clientName} · {data.dayDate} ·{' '}
        <Link to={`/days/${dayId}/frames`} className="text-spruce-700 underline">
          upload and reading
        </Link>{' '}
        ·{' '}
        <a
          href={`/api/days/${dayId}/frames?format=csv`}
          download
          className="text-spruce-700 underline"
        >
          every frame as CSV
        </a>
      </PageHeading>
      <div className="mb-5">
        <Card title="Proofs">
          <ProofsPanel dayId={dayId} dayDate={data.dayDate} canRelease />
          <p className="mt-3 text-sm">
            <Link to={`/days/${dayId}/retouch`} className="text-spruce-700 underline">
              Open the retouch queue
            </Link>
          </p>
        </Card>
      </div>
      <ReviewScreen review={data} />
    </>
  );
}
