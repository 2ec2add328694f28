import { useCallback, useState, type MouseEvent } from 'react';
import type { ReviewFrame } from '../../../../server/schemas/matching';
import { rangeWithin } from '../model/review-groups';

/** Chosen frames: a click toggles one, a shift-click adds the run from the last one chosen. */
export function useFrameSelection() {
  const [selected, setSelected] = useState<Set<string>>(new Set());
  const [anchor, setAnchor] = useState<string | null>(null);

  const choose = useCallback(
    (blockFrames: ReviewFrame[], frameId: string, event: Pick<MouseEvent, 'shiftKey'>) => {
      setSelected((current) => {
        const next = new Set(current);
        if (event.shiftKey && anchor) {
          for (const id of rangeWithin(blockFrames, anchor, frameId)) next.add(id);
        } else if (next.has(frameId)) {
          next.delete(frameId);
        } else {
          next.add(frameId);
        }
        return next;
      });
      setAnchor(frameId);
    },
    [anchor],
  );

  const clear = useCallback(() => {
    setSelected(new Set());
    setAnchor(null);
  }, []);

  /** What a drag takes: the chosen frames when it starts on one of them, else just that one. */
  const dragIds = useCallback(
    (frameId: string) => (selected.has(frameId) ? [...selected] : [frameId]),
    [selected],
  );

  return { selected, choose, clear, dragIds, setSelected };
}
