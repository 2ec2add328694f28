import { useQueryClient, type QueryClient } from '@tanstack/react-query';
import { useEffect, useState } from 'react';
import { Link, useParams, type LoaderFunctionArgs } from 'react-router-dom';
import { Card } from '../../../components/ui/card';
import { SelectField } from '../../../components/ui/field';
import { PageHeading } from '../../../components/ui/page-heading';
import {
  framesOverviewQueryOptions,
  useFramesOverview,
} from '../../../features/frames/api/get-frames-overview';
import { FrameGrid } from '../../../features/frames/components/frame-grid';
import { FrameUploader } from '../../../features/frames/components/frame-uploader';
import { IngestProgress } from '../../../features/frames/components/ingest-progress';
import { requireRole } from '../../guards';

export const makeLoader =
  (queryClient: QueryClient) =>
  async ({ request, params }: LoaderFunctionArgs) => {
    await requireRole(queryClient, request, ['studio_admin', 'photographer']);
    await queryClient.ensureQueryData(framesOverviewQueryOptions(params.dayId ?? ''));
    return null;
  };

/** After the day: upload each station's cards, watch them being read, see every frame. */
export function DayFramesPage() {
  const { dayId = '' } = useParams();
  const { data } = useFramesOverview(dayId);
  const [filter, setFilter] = useState('');
  const queryClient = useQueryClient();
  const pending = data?.stations.some((station) => station.waiting + station.reading > 0) ?? false;
  useEffect(() => {
    // Reading just finished: the grid's last look may predate it.
    if (!pending)
      void queryClient.invalidateQueries({ queryKey: ['days', dayId, 'frames', 'list'] });
  }, [pending, dayId, queryClient]);
  if (!data) return null;
  return (
    <>
      <PageHeading title="Frames">
        {data.clientName}, {data.officeName} · {data.dayDate} ·{' '}
        <Link to={`/days/${dayId}`} className="text-spruce-700 underline">
          back to the day
        </Link>{' '}
        ·{' '}
        <Link to={`/days/${dayId}/review`} className="text-spruce-700 underline">
          frames by sitter
        </Link>
      </PageHeading>
      <div className="flex flex-col gap-5">
        <Card title="Upload a card">
          <FrameUploader dayId={dayId} stations={data.stations} />
        </Card>
        <Card title="Reading the frames">
          <IngestProgress overview={data} />
        </Card>
        <Card title="Every frame">
          <div className="mb-3 max-w-sm">
            <SelectField
              label="Show"
              value={filter}
              onChange={setFilter}
              options={[
                { value: '', label: 'All stations' },
                ...data.stations.map((station) => ({
                  value: station.stationId,
                  label: station.stationName,
                })),
              ]}
            />
          </div>
          <FrameGrid dayId={dayId} stationId={filter || undefined} live={pending} />
        </Card>
      </div>
    </>
  );
}
