import { useState } from 'react';
import { formatFrame, implausibleFrames } from '../../../../server/schemas/console-rules';
import { Button } from '../../../components/ui/button';
import type { ShownSitting } from '../model/apply-pending';
import { FrameKeypad, parseFrame } from './frame-keypad';

type Which = 'first' | 'last';
export type FrameCorrection = { firstFrame: number } | { lastFrame: number };

/**
 * Puts right a mistyped first or last frame of the sitting in the chair or the last one
 * finished here. The typed number is kept on the server beside the corrected one.
 */
export function CorrectFrames({
  name,
  sitting,
  onSave,
  onCancel,
}: {
  name: string;
  sitting: ShownSitting;
  onSave: (correction: FrameCorrection) => void;
  onCancel: () => void;
}) {
  const finished = sitting.finishedAt !== null;
  const [which, setWhich] = useState<Which>('first');
  const current = which === 'first' ? sitting.firstFrame : sitting.lastFrame;
  const [frame, setFrame] = useState(current === null ? '' : String(current));
  const [error, setError] = useState<string | null>(null);

  const choose = (next: Which) => {
    const value = next === 'first' ? sitting.firstFrame : sitting.lastFrame;
    setWhich(next);
    setFrame(value === null ? '' : String(value));
    setError(null);
  };
  const save = () => {
    const parsed = parseFrame(frame);
    if ('error' in parsed) return setError(parsed.error);
    if (parsed.frame === current) return setError('This is the number already recorded.');
    const problem =
      which === 'first'
        ? implausibleFrames(parsed.frame, sitting.lastFrame)
        : implausibleFrames(sitting.firstFrame, parsed.frame);
    if (problem) return setError(problem);
    onSave(which === 'first' ? { firstFrame: parsed.frame } : { lastFrame: parsed.frame });
  };

  const choices: Array<{ value: Which; label: string }> = [
    { value: 'first', label: `First frame ${formatFrame(sitting.firstFrame)}` },
    ...(finished
      ? [
          {
            value: 'last' as const,
            label: `Last frame ${sitting.lastFrame === null ? 'not entered' : formatFrame(sitting.lastFrame)}`,
          },
        ]
      : []),
  ];
  return (
    <div
      role="dialog"
      aria-modal="true"
      aria-labelledby="correct-title"
      className="fixed inset-0 z-40 flex items-center justify-center bg-ink/40 p-4"
    >
      <div className="flex max-h-full w-full max-w-md flex-col gap-4 overflow-y-auto rounded-card bg-paper-raised p-6 shadow-card">
        <h2 id="correct-title" className="text-2xl font-semibold">
          Correct frame numbers of {name}
        </h2>
        {finished ? null : (
          <p className="text-base text-ink-muted">
            Still in the chair: the last frame is entered when you finish.
          </p>
        )}
        <div role="group" aria-label="Number to correct" className="flex flex-wrap gap-2">
          {choices.map((choice) => (
            <button
              key={choice.value}
              type="button"
              aria-pressed={which === choice.value}
              onClick={() => choose(choice.value)}
              className={`min-h-touch flex-1 rounded-control border px-4 text-base font-semibold ${
                which === choice.value
                  ? 'border-spruce-600 bg-spruce-600 text-paper-raised'
                  : 'border-line-strong bg-paper-raised text-spruce-700'
              }`}
            >
              {choice.label}
            </button>
          ))}
        </div>
        <FrameKeypad
          key={which}
          label={which === 'first' ? 'Corrected first frame' : 'Corrected last frame'}
          value={frame}
          onChange={(value) => {
            setFrame(value);
            setError(null);
          }}
          error={error}
        />
        <div className="flex flex-wrap gap-2">
          <Button className="flex-1" onClick={save}>
            Save correction
          </Button>
          <Button variant="quiet" onClick={onCancel}>
            Cancel
          </Button>
        </div>
      </div>
    </div>
  );
}
