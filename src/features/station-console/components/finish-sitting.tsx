import { useState } from 'react';
import { formatFrame, implausibleFrames } from '../../../../server/schemas/console-rules';
import { Button } from '../../../components/ui/button';
import { FrameKeypad, parseFrame } from './frame-keypad';

/**
 * Ends a sitting; the last frame number is welcome but optional. A last frame that cannot
 * follow the first is refused here, as the server would, with the way out offered at once:
 * the first frame was most likely mistyped on the slate, so it can be corrected and the
 * sitting finished in one go.
 */
export function FinishSitting({
  name,
  firstFrame,
  typedFirstFrame,
  refusedLastFrame,
  onFinish,
  onCorrectFirstAndFinish,
  onCancel,
}: {
  name: string;
  firstFrame: number;
  typedFirstFrame: number;
  /** The last frame the server refused, to show the refusal again with its fix. */
  refusedLastFrame?: number;
  onFinish: (lastFrame: number | null) => void;
  onCorrectFirstAndFinish: (firstFrame: number, lastFrame: number) => void;
  onCancel: () => void;
}) {
  const refusal = (last: number) => implausibleFrames(firstFrame, last);
  const [frame, setFrame] = useState(refusedLastFrame ? String(refusedLastFrame) : '');
  const [error, setError] = useState<string | null>(
    refusedLastFrame ? refusal(refusedLastFrame) : null,
  );
  const [refused, setRefused] = useState<number | null>(
    refusedLastFrame && refusal(refusedLastFrame) ? refusedLastFrame : null,
  );
  const [correcting, setCorrecting] = useState(false);
  const [first, setFirst] = useState(String(firstFrame));
  const [firstError, setFirstError] = useState<string | null>(null);

  const finishWithLast = () => {
    const parsed = parseFrame(frame);
    if ('error' in parsed) return setError(parsed.error);
    const problem = refusal(parsed.frame);
    if (problem) {
      setError(problem);
      setRefused(parsed.frame);
      return;
    }
    onFinish(parsed.frame);
  };
  const correctAndFinish = () => {
    if (refused === null) return;
    const parsed = parseFrame(first);
    if ('error' in parsed) return setFirstError(parsed.error);
    const problem = implausibleFrames(parsed.frame, refused);
    if (problem) return setFirstError(problem);
    if (parsed.frame === firstFrame) return onFinish(refused);
    onCorrectFirstAndFinish(parsed.frame, refused);
  };

  return (
    <div
      role="dialog"
      aria-modal="true"
      aria-labelledby="finish-title"
      className="fixed inset-0 z-40 flex items-center justify-center bg-ink/40 p-4"
    >
      <div className="flex max-h-full w-full max-w-md flex-col gap-4 overflow-y-auto rounded-card bg-paper-raised p-6 shadow-card">
        <h2 id="finish-title" className="text-2xl font-semibold">
          Finish {name}
        </h2>
        {correcting && refused !== null ? (
          <>
            <p className="text-base text-ink-muted">
              Last frame {formatFrame(refused)}. Type the first frame as the camera shows it on the
              slate photo.
            </p>
            <FrameKeypad
              key="first"
              label="Corrected first frame"
              value={first}
              onChange={(value) => {
                setFirst(value);
                setFirstError(null);
              }}
              error={firstError}
            />
            <div className="flex flex-wrap gap-2">
              <Button className="flex-1" onClick={correctAndFinish}>
                Correct and finish
              </Button>
              <Button variant="secondary" onClick={() => setCorrecting(false)}>
                Back
              </Button>
            </div>
          </>
        ) : (
          <>
            <p className="text-base text-ink-muted">
              Started at frame {formatFrame(firstFrame)}. Enter the last frame if you have it.
            </p>
            <FrameKeypad
              key="last"
              label="Last frame number"
              value={frame}
              onChange={(value) => {
                setFrame(value);
                setError(null);
                setRefused(null);
              }}
              error={error}
            />
            {refused !== null ? (
              <Button variant="secondary" onClick={() => setCorrecting(true)}>
                First frame was {typedFirstFrame === firstFrame ? 'typed as' : 'corrected to'}{' '}
                {formatFrame(firstFrame)} — correct it
              </Button>
            ) : null}
            <div className="flex flex-wrap gap-2">
              <Button className="flex-1" onClick={finishWithLast}>
                Finish with last frame
              </Button>
              <Button variant="secondary" onClick={() => onFinish(null)}>
                Finish without
              </Button>
              <Button variant="quiet" onClick={onCancel}>
                Cancel
              </Button>
            </div>
          </>
        )}
      </div>
    </div>
  );
}
