import type { DayReview, ReviewFrame, ReviewSitter } from '../../../../server/schemas/matching';

/** One block of the review screen: the frames that need a look, a sitter's frames, test frames. */
export type ReviewGroup =
  | { kind: 'attention'; key: 'attention'; frames: ReviewFrame[] }
  | { kind: 'sitter'; key: string; sitter: ReviewSitter; frames: ReviewFrame[] }
  | { kind: 'test'; key: 'test'; frames: ReviewFrame[] };

const needsALook = (frame: ReviewFrame) =>
  frame.reason === 'conflict' || frame.reason === 'leftover' || frame.reason === 'not_read_yet';

/**
 * Splits the day into blocks, in shooting order. With a station chosen, only that station's
 * frames and sitters show; with `onlyProblems`, sitters whose frames are all sure are hidden,
 * but a sitter with no frames at all stays (that needs a look too).
 */
export function reviewGroups(
  review: DayReview,
  options: { stationId: string; onlyProblems: boolean },
): ReviewGroup[] {
  const frames = options.stationId
    ? review.frames.filter((frame) => frame.stationId === options.stationId)
    : review.frames;
  const byPerson = new Map<string, ReviewFrame[]>();
  for (const frame of frames) {
    if (!frame.personId) continue;
    const list = byPerson.get(frame.personId) ?? [];
    list.push(frame);
    byPerson.set(frame.personId, list);
  }
  const groups: ReviewGroup[] = [
    { kind: 'attention', key: 'attention', frames: frames.filter(needsALook) },
  ];
  for (const sitter of review.sitters) {
    const own = byPerson.get(sitter.personId) ?? [];
    if (options.stationId && sitter.stationId !== options.stationId && own.length === 0) continue;
    const hasManual = own.some((frame) => frame.reason === 'manual');
    if (options.onlyProblems && own.length > 0 && !hasManual) continue;
    groups.push({ kind: 'sitter', key: `sitter:${sitter.personId}`, sitter, frames: own });
  }
  groups.push({
    kind: 'test',
    key: 'test',
    frames: frames.filter((frame) => frame.reason === 'manual_test_frame'),
  });
  return groups;
}

/** The frames from one to another within a block, either way round (a shift-click). */
export function rangeWithin(frames: ReviewFrame[], fromId: string, toId: string): string[] {
  const from = frames.findIndex((frame) => frame.id === fromId);
  const to = frames.findIndex((frame) => frame.id === toId);
  if (from < 0 || to < 0) return [toId];
  const [start, end] = from <= to ? [from, to] : [to, from];
  return frames.slice(start, end + 1).map((frame) => frame.id);
}

/** "0451", "101/0001" when the folder matters to tell two frames apart. */
export function frameLabel(frame: Pick<ReviewFrame, 'number' | 'folder' | 'fileName'>) {
  if (frame.number === null) return frame.fileName;
  const number = String(frame.number).padStart(4, '0');
  return frame.folder === null ? number : `${frame.folder}/${number}`;
}
