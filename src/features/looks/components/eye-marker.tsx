import { useRef, useState, type PointerEvent } from 'react';
import { Button } from '../../../components/ui/button';

import { startingEyeMarks, type Point } from '../../../../server/schemas/looks';

/**
 * Two eye marks dragged onto a downscaled copy of the portrait (pointer: mouse, pen or touch;
 * the arrow keys nudge the chosen mark). Marks are kept in the source image's pixels.
 */
export function EyeMarker({
  pickId,
  imageWidth,
  imageHeight,
  initial,
  onSave,
  busy,
}: {
  pickId: string;
  imageWidth: number;
  imageHeight: number;
  initial: { left: Point; right: Point } | null;
  onSave: (marks: { leftEye: Point; rightEye: Point }) => void;
  busy: boolean;
}) {
  const frame = useRef<HTMLDivElement>(null);
  const [marks, setMarks] = useState(() => initial ?? startingEyeMarks(imageWidth, imageHeight));
  const [dragging, setDragging] = useState<'left' | 'right' | null>(null);

  const toSource = (event: PointerEvent) => {
    const box = frame.current!.getBoundingClientRect();
    return {
      x: Math.min(imageWidth, Math.max(0, ((event.clientX - box.left) / box.width) * imageWidth)),
      y: Math.min(imageHeight, Math.max(0, ((event.clientY - box.top) / box.height) * imageHeight)),
    };
  };
  const nudge = (which: 'left' | 'right', dx: number, dy: number) =>
    setMarks((current) => ({
      ...current,
      [which]: { x: current[which].x + dx, y: current[which].y + dy },
    }));

  return (
    <div className="flex flex-col gap-2">
      <div
        ref={frame}
        className="relative w-full max-w-md touch-none select-none"
        style={{ aspectRatio: `${imageWidth} / ${imageHeight}` }}
        onPointerMove={(event) => {
          if (dragging) setMarks((current) => ({ ...current, [dragging]: toSource(event) }));
        }}
        onPointerUp={() => setDragging(null)}
      >
        <img
          src={`/api/picks/${pickId}/source-preview`}
          alt="The portrait to mark"
          className="h-full w-full"
          draggable={false}
        />
        {(['left', 'right'] as const).map((which) => (
          <button
            key={which}
            type="button"
            aria-label={`${which === 'left' ? 'Left' : 'Right'} eye mark (arrow keys move it)`}
            data-eye={which}
            className="absolute size-6 -translate-x-1/2 -translate-y-1/2 rounded-full border-2 border-paper-raised bg-danger-600/70 focus-visible:outline-2"
            style={{
              left: `${(marks[which].x / imageWidth) * 100}%`,
              top: `${(marks[which].y / imageHeight) * 100}%`,
            }}
            onPointerDown={(event) => {
              event.currentTarget.setPointerCapture?.(event.pointerId);
              setDragging(which);
            }}
            onPointerMove={(event) => {
              if (dragging === which)
                setMarks((current) => ({ ...current, [which]: toSource(event) }));
            }}
            onPointerUp={() => setDragging(null)}
            onKeyDown={(event) => {
              const step = (event.shiftKey ? 10 : 1) * Math.max(1, imageWidth / 1000);
              const moves: Record<string, [number, number]> = {
                ArrowLeft: [-step, 0],
                ArrowRight: [step, 0],
                ArrowUp: [0, -step],
                ArrowDown: [0, step],
              };
              const move = moves[event.key];
              if (!move) return;
              event.preventDefault();
              nudge(which, move[0], move[1]);
            }}
          />
        ))}
      </div>
      <div>
        <Button busy={busy} onClick={() => onSave({ leftEye: marks.left, rightEye: marks.right })}>
          Save the eye marks
        </Button>
      </div>
    </div>
  );
}
