import type { DayReview } from '../../../../server/schemas/matching';
import { Button } from '../../../components/ui/button';
import { Notice } from '../../../components/ui/notice';

const causeWords = {
  frames: 'after frames were read',
  sittings: 'after a sitting changed',
  on_demand: 'when asked',
} as const;

function Count({ label, value, loud = false }: { label: string; value: number; loud?: boolean }) {
  return (
    <div
      className={`flex min-w-28 flex-col rounded-control border px-3 py-2 ${
        loud && value > 0 ? 'border-caution-600 bg-caution-50' : 'border-line bg-paper-raised'
      }`}
    >
      <dt className="text-sm text-ink-muted">{label}</dt>
      <dd className="text-2xl font-semibold tabular-nums text-ink">
        {value.toLocaleString('en-GB')}
      </dd>
    </div>
  );
}

/** The day's counts, what the last run found and changed, and a way to run it again. */
export function ReviewSummary({
  review,
  onRun,
  running,
}: {
  review: DayReview;
  onRun: () => void;
  running: boolean;
}) {
  const { counts, lastRun } = review;
  return (
    <div className="flex flex-col gap-3">
      <dl className="flex flex-wrap gap-2" aria-label="Counts">
        <Count label="Frames" value={counts.frames} />
        <Count label="Matched" value={counts.matched} />
        <Count label="Conflicts" value={counts.conflicts} loud />
        <Count label="Left over" value={counts.leftovers} loud />
        <Count label="Test frames" value={counts.testFrames} />
        <Count label="Sitters with no frames" value={counts.sittersWithoutFrames} loud />
        <Count label="Booked, not photographed" value={counts.notPhotographed} />
      </dl>
      <div className="flex flex-wrap items-center gap-3">
        <Button variant="secondary" onClick={onRun} busy={running || review.matching}>
          {review.matching ? 'Matching…' : 'Match again'}
        </Button>
        <span className="text-sm text-ink-muted" aria-live="polite">
          {review.matching
            ? 'Matching the day now; this page updates by itself.'
            : lastRun
              ? `Last matched ${new Date(lastRun.finishedAt).toLocaleTimeString('en-GB')} ${causeWords[lastRun.cause]}; ${
                  lastRun.changed === 0
                    ? 'no automatic result changed.'
                    : `${lastRun.changed} automatic result${lastRun.changed === 1 ? '' : 's'} changed.`
                }`
              : 'Not matched yet: the match runs once frames are read.'}
          {counts.notReadYet > 0 ? ` ${counts.notReadYet} frames are still being read.` : ''}
        </span>
      </div>
      {lastRun && lastRun.changes.length > 0 ? (
        <details className="text-sm">
          <summary className="cursor-pointer text-spruce-700">What the last run changed</summary>
          <ul className="mt-1 list-disc pl-5">
            {lastRun.changes.map((change) => (
              <li key={change.frameId}>
                {change.fileName ?? 'A frame'}: {change.from ?? 'nobody'} → {change.to ?? 'nobody'}
                {change.pinned ? ' (your decision stands)' : ''}
              </li>
            ))}
          </ul>
        </details>
      ) : null}
      {lastRun?.cameraOffsets.length ? (
        <p className="text-sm text-ink-muted">
          Camera clocks against the server:{' '}
          {lastRun.cameraOffsets
            .map(
              (camera) =>
                `${camera.camera} ${camera.offsetMinutes >= 0 ? '+' : '−'}${Math.abs(camera.offsetMinutes)} min`,
            )
            .join(', ')}
          .
        </p>
      ) : null}
      {lastRun?.typedFrameMismatches.map((mismatch) => (
        <Notice key={`${mismatch.sitterName}-${mismatch.typed}`} tone="caution">
          {mismatch.sitterName}: the first frame was typed as{' '}
          {String(mismatch.typed).padStart(4, '0')}, but the slate is frame{' '}
          {String(mismatch.slateFrame).padStart(4, '0')}. The slate was trusted.
        </Notice>
      ))}
    </div>
  );
}
