import { useState } from 'react';
import { formatFrame } from '../../../../server/schemas/console-rules';
import { Button } from '../../../components/ui/button';
import { FrameKeypad, parseFrame } from './frame-keypad';

/** Ends a sitting; the last frame number is welcome but optional. */
export function FinishSitting({
  name,
  firstFrame,
  onFinish,
  onCancel,
}: {
  name: string;
  firstFrame: number;
  onFinish: (lastFrame: number | null) => void;
  onCancel: () => void;
}) {
  const [frame, setFrame] = useState('');
  const [error, setError] = useState<string | null>(null);
  return (
    <div
      role="dialog"
      aria-modal="true"
      aria-labelledby="finish-title"
      className="fixed inset-0 z-40 flex items-center justify-center bg-ink/40 p-4"
    >
      <div className="flex w-full max-w-md flex-col gap-4 rounded-card bg-paper-raised p-6 shadow-card">
        <h2 id="finish-title" className="text-2xl font-semibold">
          Finish {name}
        </h2>
        <p className="text-base text-ink-muted">
          Started at frame {formatFrame(firstFrame)}. Enter the last frame if you have it.
        </p>
        <FrameKeypad
          label="Last frame number"
          value={frame}
          onChange={(value) => {
            setFrame(value);
            setError(null);
          }}
          error={error}
        />
        <div className="flex flex-wrap gap-2">
          <Button
            className="flex-1"
            onClick={() => {
              const parsed = parseFrame(frame);
              if ('error' in parsed) setError(parsed.error);
              else onFinish(parsed.frame);
            }}
          >
            Finish with last frame
          </Button>
          <Button variant="secondary" onClick={() => onFinish(null)}>
            Finish without
          </Button>
          <Button variant="quiet" onClick={onCancel}>
            Cancel
          </Button>
        </div>
      </div>
    </div>
  );
}
