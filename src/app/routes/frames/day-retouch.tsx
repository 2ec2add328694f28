import type { QueryClient } from '@tanstack/react-query';
import { Link, useParams, type LoaderFunctionArgs } from 'react-router-dom';
import { Card } from '../../../components/ui/card';
import { PageHeading } from '../../../components/ui/page-heading';
import { reviewQueryOptions, useReview } from '../../../features/review/api/get-review';
import { FinalsUploader } from '../../../features/retouch/components/finals-uploader';
import { RetouchTable } from '../../../features/retouch/components/retouch-table';
import { requireRole } from '../../guards';

export const makeLoader =
  (queryClient: QueryClient) =>
  async ({ request, params }: LoaderFunctionArgs) => {
    await requireRole(queryClient, request, ['studio_admin', 'photographer']);
    await queryClient.ensureQueryData(reviewQueryOptions(params.dayId ?? ''));
    return null;
  };

/** After the picks: the retouch queue, the originals to work on, the finals coming back. */
export function DayRetouchPage() {
  const { dayId = '' } = useParams();
  const { data } = useReview(dayId);
  if (!data) return null;
  return (
    <>
      <PageHeading title="Retouch queue">
        {data.clientName} · {data.dayDate} ·{' '}
        <Link to={`/days/${dayId}/review`} className="text-spruce-700 underline">
          frames by sitter
        </Link>{' '}
        ·{' '}
        <a
          href={`/api/days/${dayId}/retouch/originals.zip`}
          download
          className="text-spruce-700 underline"
        >
          download every pick’s original (ZIP)
        </a>
      </PageHeading>
      <div className="flex flex-col gap-5">
        <Card title="Picks">
          <RetouchTable dayId={dayId} stations={data.stations} />
        </Card>
        <Card title="Send the finished files back">
          <p className="mb-3 text-sm text-ink-muted">
            Each file is matched to its pick by the original’s name or frame number (editors keep
            them). The final replaces the original in the delivery; the original is kept.
          </p>
          <FinalsUploader dayId={dayId} />
        </Card>
      </div>
    </>
  );
}
