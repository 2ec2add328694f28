import { useState, type DragEvent, type KeyboardEvent, type MouseEvent } from 'react';
import type { ReviewFrame } from '../../../../server/schemas/matching';
import type { ReviewGroup } from '../model/review-groups';
import { FrameTile, framesDragType } from './frame-tile';

const timeOf = (iso: string) =>
  new Date(iso).toLocaleTimeString('en-GB', { hour: '2-digit', minute: '2-digit' });

function BlockHeading({ group, stationName }: { group: ReviewGroup; stationName: string }) {
  if (group.kind === 'attention') {
    return (
      <>
        <h3 className="font-semibold text-ink">Needs a look ({group.frames.length})</h3>
        <p className="text-sm text-ink-muted">
          Frames nothing ties to one sitter. Choose them, then give them to someone or mark them as
          test frames.
        </p>
      </>
    );
  }
  if (group.kind === 'test') {
    return <h3 className="font-semibold text-ink">Test frames ({group.frames.length})</h3>;
  }
  const { sitter } = group;
  return (
    <div className="flex flex-wrap items-baseline gap-x-3">
      <h3 className="font-semibold text-ink">{sitter.name}</h3>
      <span className="text-sm text-ink-muted">
        {[
          sitter.employeeId,
          stationName,
          sitter.startedAt ? `started ${timeOf(sitter.startedAt)}` : 'split off by hand',
          sitter.firstFrame
            ? `first frame typed ${String(sitter.firstFrame).padStart(4, '0')}`
            : null,
          `${group.frames.length} frame${group.frames.length === 1 ? '' : 's'}`,
        ]
          .filter(Boolean)
          .join(' · ')}
      </span>
      {group.frames.length === 0 ? (
        <span className="rounded-control bg-caution-50 px-2 text-sm font-medium text-ink">
          No frames: photographed, but nothing matched
        </span>
      ) : null}
    </div>
  );
}

/** A block of frames that frames can be dropped onto (a sitter, or the test frames). */
export function ReviewBlock({
  group,
  stationName,
  selected,
  candidateNames,
  onChoose,
  dragIds,
  onDropFrames,
}: {
  group: ReviewGroup;
  stationName: string;
  selected: Set<string>;
  candidateNames: (frame: ReviewFrame) => string[];
  onChoose: (group: ReviewGroup, frameId: string, event: MouseEvent | KeyboardEvent) => void;
  dragIds: (frameId: string) => string[];
  onDropFrames: ((frameIds: string[]) => void) | null;
}) {
  const [over, setOver] = useState(false);
  const accepts = onDropFrames !== null;
  const onDragOver = (event: DragEvent) => {
    if (!accepts || !event.dataTransfer.types.includes(framesDragType)) return;
    event.preventDefault();
    event.dataTransfer.dropEffect = 'move';
    setOver(true);
  };
  const onDrop = (event: DragEvent) => {
    setOver(false);
    const raw = event.dataTransfer.getData(framesDragType);
    if (!accepts || !raw) return;
    event.preventDefault();
    onDropFrames(JSON.parse(raw) as string[]);
  };
  return (
    <section
      aria-label={group.kind === 'sitter' ? group.sitter.name : undefined}
      data-block={group.key}
      onDragOver={onDragOver}
      onDragLeave={() => setOver(false)}
      onDrop={onDrop}
      className={`flex flex-col gap-2 rounded-card border p-3 ${
        over ? 'border-spruce-600 bg-spruce-50' : 'border-line bg-paper-raised'
      }`}
    >
      <BlockHeading group={group} stationName={stationName} />
      {group.frames.length > 0 ? (
        <ul className="flex flex-wrap gap-2">
          {group.frames.map((frame) => (
            <FrameTile
              key={frame.id}
              frame={frame}
              selected={selected.has(frame.id)}
              candidateNames={candidateNames(frame)}
              onChoose={(frameId, event) => onChoose(group, frameId, event)}
              dragIds={dragIds}
            />
          ))}
        </ul>
      ) : group.kind !== 'sitter' ? (
        <p className="text-sm text-ink-muted">None.</p>
      ) : null}
    </section>
  );
}
