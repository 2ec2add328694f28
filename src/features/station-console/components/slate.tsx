import QRCode from 'qrcode';
import { useEffect, useState } from 'react';
import { Button } from '../../../components/ui/button';
import { FrameKeypad, frameDoubt, parseFrame } from './frame-keypad';
import { NO_FLASH_WORDING } from '../../../../server/schemas/sitter-wording';

/**
 * The slate: the sitter's name in large type and a QR code with the sitting's token, filling
 * the screen so the photographer can photograph it as the sitting's first frame. It is a still
 * card: nothing on it moves or flashes (WCAG 2.3.1 allows at most three flashes a second; we
 * use none), which also matters for flash-sensitive sitters.
 */
export function Slate({
  name,
  slateToken,
  flashSensitive,
  expectedFrame,
  onStart,
  onCancel,
}: {
  name: string;
  slateToken: string;
  flashSensitive: boolean;
  expectedFrame: number | null;
  onStart: (firstFrame: number) => void;
  onCancel: () => void;
}) {
  const [code, setCode] = useState<string | null>(null);
  const [frame, setFrame] = useState(expectedFrame === null ? '' : String(expectedFrame));
  const [error, setError] = useState<string | null>(null);
  const [doubtAccepted, setDoubtAccepted] = useState<number | null>(null);
  useEffect(() => {
    let current = true;
    void QRCode.toString([{ data: slateToken, mode: 'alphanumeric' }], {
      type: 'svg',
      errorCorrectionLevel: 'M',
      margin: 4,
      color: { dark: '#1b2228ff', light: '#ffffffff' },
    }).then((svg) => {
      if (current) setCode(`data:image/svg+xml;charset=utf-8,${encodeURIComponent(svg)}`);
    });
    return () => {
      current = false;
    };
  }, [slateToken]);

  const parsedFrame = parseFrame(frame);
  const doubt = 'frame' in parsedFrame ? frameDoubt(parsedFrame.frame, expectedFrame) : null;
  const start = () => {
    if ('error' in parsedFrame) setError(parsedFrame.error);
    // A doubtful number needs a second press: the first shows why.
    else if (doubt && doubtAccepted !== parsedFrame.frame) {
      setError(doubt);
      setDoubtAccepted(parsedFrame.frame);
    } else onStart(parsedFrame.frame);
  };

  return (
    <div
      role="dialog"
      aria-modal="true"
      aria-labelledby="slate-name"
      className="fixed inset-0 z-40 flex bg-paper-raised text-ink"
    >
      <div className="flex flex-1 flex-col items-center justify-center gap-6 p-6">
        <p className="text-xl font-medium uppercase tracking-wide text-ink-muted">Slate</p>
        <h2 id="slate-name" className="text-center text-6xl leading-tight font-bold">
          {name}
        </h2>
        {code ? (
          <img
            src={code}
            alt={`Slate code for ${name}`}
            className="size-72 max-h-[45vh] max-w-full"
          />
        ) : (
          <div className="size-72" aria-hidden />
        )}
        <p className="font-mono text-lg tracking-wider text-ink-muted">{slateToken}</p>
        {flashSensitive ? (
          <p className="rounded-control border-2 border-danger-600 bg-danger-50 px-4 py-2 text-lg font-semibold text-danger-700">
            {NO_FLASH_WORDING}
          </p>
        ) : null}
      </div>
      <div className="flex w-80 flex-col justify-center gap-4 border-l border-line bg-paper p-5">
        <FrameKeypad
          label="Frame number of the slate photo"
          value={frame}
          onChange={(value) => {
            setFrame(value);
            setError(null);
            setDoubtAccepted(null);
          }}
          error={error}
        />
        <Button className="min-h-16 text-xl" onClick={start}>
          {'frame' in parsedFrame && doubtAccepted === parsedFrame.frame
            ? `Yes, start at ${frame.padStart(4, '0')}`
            : 'Start sitting'}
        </Button>
        <Button variant="secondary" onClick={onCancel}>
          Back to the queue
        </Button>
      </div>
    </div>
  );
}
