import { useState } from 'react';
import { ingestStatusLabels } from '../../../../server/schemas/frames';
import { matchReasonLabels } from '../../../../server/schemas/matching';
import { Button } from '../../../components/ui/button';
import { EmptyState } from '../../../components/ui/empty-state';
import { useFrames } from '../api/list-frames';

const PAGE_SIZE = 60;

/** The day's frames in card order, with what was read from each. */
export function FrameGrid({
  dayId,
  stationId,
  live,
}: {
  dayId: string;
  stationId?: string;
  live: boolean;
}) {
  const [page, setPage] = useState(1);
  const { data } = useFrames(dayId, { stationId, page, pageSize: PAGE_SIZE }, live ? 3000 : false);
  if (!data) return null;
  if (data.total === 0) {
    return (
      <EmptyState title="No frames yet">
        Upload a card above: each frame appears here once it has been read.
      </EmptyState>
    );
  }
  const pages = Math.max(1, Math.ceil(data.total / PAGE_SIZE));
  return (
    <div className="flex flex-col gap-3">
      <ul
        className="grid grid-cols-[repeat(auto-fill,minmax(10rem,1fr))] gap-3"
        aria-label="Frames"
      >
        {data.frames.map((frame) => (
          <li
            key={frame.id}
            className="flex flex-col gap-1 rounded-control border border-line bg-paper-raised p-2 text-xs"
          >
            {frame.ingestStatus === 'read' && !frame.noPreview ? (
              <img
                src={`/api/frames/${frame.id}/thumbnail`}
                alt={`Frame ${frame.cardPath}`}
                loading="lazy"
                className="aspect-[3/2] w-full rounded-control bg-paper-sunk object-contain"
              />
            ) : (
              <div className="flex aspect-[3/2] w-full items-center justify-center rounded-control bg-paper-sunk px-2 text-center text-ink-muted">
                {frame.noPreview
                  ? 'No preview in this file'
                  : ingestStatusLabels[frame.ingestStatus]}
              </div>
            )}
            <span className="truncate font-mono" title={frame.cardPath}>
              {frame.cardPath.split('/').pop()}
            </span>
            <span className="text-ink-muted">
              {frame.capturedLocal
                ? frame.capturedLocal.replace('T', ' ').slice(0, 19)
                : 'no capture time'}
              {frame.hasRaw ? ' · raw too' : ''}
            </span>
            {frame.slateSitterName || frame.slateToken ? (
              <span className="font-medium text-spruce-700">
                Slate
                {frame.slateSitterName
                  ? `: ${frame.slateSitterName}`
                  : ' (no sitting has this code)'}
              </span>
            ) : null}
            <span className={frame.personId ? 'text-ink' : 'text-ink-muted'}>
              {frame.sitterName ?? matchReasonLabels[frame.matchReason]}
            </span>
            {frame.ingestError ? (
              <span className="text-danger-700">{frame.ingestError}</span>
            ) : null}
          </li>
        ))}
      </ul>
      {pages > 1 ? (
        <div className="flex items-center gap-3">
          <Button variant="secondary" disabled={page <= 1} onClick={() => setPage(page - 1)}>
            Previous
          </Button>
          <span>
            Page {page} of {pages}
          </span>
          <Button variant="secondary" disabled={page >= pages} onClick={() => setPage(page + 1)}>
            Next
          </Button>
        </div>
      ) : null}
    </div>
  );
}
