import { formatFrame } from '../../../../server/schemas/console-rules';
import { Button } from '../../../components/ui/button';
import type { ShownSitting } from '../model/apply-pending';

const range = (sitting: ShownSitting) =>
  sitting.lastFrame === null
    ? `from ${formatFrame(sitting.firstFrame)}`
    : `${formatFrame(sitting.firstFrame)}–${formatFrame(sitting.lastFrame)}`;

/** What was typed, when a correction changed it; null when the numbers stand as typed. */
function typedNote(sitting: ShownSitting): string | null {
  if (!sitting.framesCorrectedAt) return null;
  const typed: string[] = [];
  if (sitting.typedFirstFrame !== sitting.firstFrame) {
    typed.push(`first typed as ${formatFrame(sitting.typedFirstFrame)}`);
  }
  if (sitting.finishedAt !== null && sitting.typedLastFrame !== sitting.lastFrame) {
    typed.push(
      sitting.typedLastFrame === null
        ? 'last not entered at finish'
        : `last typed as ${formatFrame(sitting.typedLastFrame)}`,
    );
  }
  return typed.length > 0 ? `Corrected: ${typed.join(', ')}` : 'Corrected';
}

/**
 * The frame numbers of the sitting in the chair and the last one finished at this station,
 * each with a plain way to correct them.
 */
export function StationFrames({
  inChair,
  lastFinished,
  nameOf,
  canAct,
  onCorrect,
}: {
  inChair: ShownSitting | null;
  lastFinished: ShownSitting | null;
  nameOf: (sitting: ShownSitting) => string;
  canAct: boolean;
  onCorrect: (sitting: ShownSitting) => void;
}) {
  const rows = [
    inChair ? { sitting: inChair, heading: 'In the chair' } : null,
    lastFinished ? { sitting: lastFinished, heading: 'Last finished' } : null,
  ].filter((row) => row !== null);
  if (rows.length === 0) return null;
  return (
    <section
      aria-labelledby="station-frames-title"
      className="flex flex-col gap-2 rounded-card border border-line bg-paper-raised p-3"
    >
      <h2 id="station-frames-title" className="text-lg font-semibold">
        Frame numbers here
      </h2>
      <div className="flex flex-col gap-2">
        {rows.map(({ sitting, heading }) => {
          const note = typedNote(sitting);
          return (
            // A group, not a list item, so the queue stays the one list of sitters on the screen.
            <div
              role="group"
              key={sitting.id}
              aria-label={`${heading}: ${nameOf(sitting)}`}
              className="flex flex-wrap items-center gap-x-4 gap-y-1"
            >
              <div className="flex min-w-48 flex-1 flex-col">
                <p className="text-base">
                  <span className="text-ink-muted">{heading}:</span> {nameOf(sitting)}
                </p>
                <p className="font-mono text-xl tabular-nums">{range(sitting)}</p>
                {note ? <p className="text-sm font-medium text-caution-600">{note}</p> : null}
              </div>
              {canAct ? (
                <Button variant="secondary" onClick={() => onCorrect(sitting)}>
                  Correct frame numbers
                </Button>
              ) : null}
            </div>
          );
        })}
      </div>
    </section>
  );
}
