import type { DragEvent, KeyboardEvent, MouseEvent } from 'react';
import { matchReasonLabels, type ReviewFrame } from '../../../../server/schemas/matching';
import { frameLabel } from '../model/review-groups';

export const framesDragType = 'application/x-likeness-frames';

const standsOut = new Set(['conflict', 'leftover', 'not_read_yet']);

/**
 * One frame as a thumbnail. Clicking (or Space/Enter) chooses it, shift-click chooses a run;
 * dragging takes the chosen frames along. Sure matches stay quiet; doubts stand out.
 */
export function FrameTile({
  frame,
  selected,
  candidateNames,
  onChoose,
  dragIds,
}: {
  frame: ReviewFrame;
  selected: boolean;
  candidateNames: string[];
  onChoose: (frameId: string, event: MouseEvent | KeyboardEvent) => void;
  dragIds: (frameId: string) => string[];
}) {
  const loud = standsOut.has(frame.reason);
  const manual = frame.reason === 'manual' || frame.reason === 'manual_test_frame';
  const reason =
    frame.reason === 'conflict' && candidateNames.length > 0
      ? `${matchReasonLabels.conflict}: ${candidateNames.join(' or ')}`
      : matchReasonLabels[frame.reason];
  const onDragStart = (event: DragEvent) => {
    event.dataTransfer.setData(framesDragType, JSON.stringify(dragIds(frame.id)));
    event.dataTransfer.effectAllowed = 'move';
  };
  return (
    <li className="w-36">
      {/* A div, not a <button>: Chromium starts no drag from a form control. */}
      <div
        role="button"
        tabIndex={0}
        draggable
        onDragStart={onDragStart}
        onClick={(event) => onChoose(frame.id, event)}
        onKeyDown={(event) => {
          if (event.key !== ' ' && event.key !== 'Enter') return;
          event.preventDefault();
          onChoose(frame.id, event);
        }}
        aria-pressed={selected}
        aria-label={`Frame ${frameLabel(frame)}: ${reason}`}
        data-frame-id={frame.id}
        title={`${frame.fileName} · ${reason}`}
        className={`flex min-h-touch w-full cursor-grab flex-col gap-1 rounded-control border-2 p-1 text-left text-xs focus-visible:outline-2 focus-visible:outline-spruce-600 ${
          selected
            ? 'border-spruce-600 bg-spruce-50'
            : loud
              ? 'border-caution-600 bg-caution-50'
              : 'border-line bg-paper-raised'
        }`}
      >
        {frame.hasThumbnail ? (
          <img
            src={`/api/frames/${frame.id}/thumbnail`}
            alt=""
            loading="lazy"
            draggable={false}
            className="aspect-[3/2] w-full rounded-control bg-paper-sunk object-cover"
          />
        ) : (
          <span className="flex aspect-[3/2] w-full items-center justify-center rounded-control bg-paper-sunk text-ink-muted">
            No preview
          </span>
        )}
        <span className="flex items-center justify-between gap-1 font-mono">
          <span>{frameLabel(frame)}</span>
          {manual ? <span className="font-sans text-spruce-700">by hand</span> : null}
        </span>
        {loud ? <span className="text-ink">{reason}</span> : null}
      </div>
    </li>
  );
}
