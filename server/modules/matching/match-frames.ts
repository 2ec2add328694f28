/**
 * Ties every frame of a day to a sitting, or leaves it over: a pure function, no database.
 * Evidence, strongest first: a manual decision; a slate (the frame shows a sitting's QR code,
 * and the frames after it follow until the next slate); the capture time corrected by the
 * camera's estimated clock offset, placed in a sitting's window at the camera's station; the
 * frame number typed at the console. Anything not certain is a conflict or a leftover, never a
 * guess.
 */
import { applyManual } from './match-manual';
import { framesByCamera, shootingOrder } from './match-order';
import { median, typedOffset } from './match-offsets';
import { indexSittings, LOOK_BACK } from './match-stations';
import { cameraSlates, walkCamera, type Walk } from './match-walk';

export interface MatchFrame {
  id: string;
  stationId: string;
  cameraSerial: string | null;
  folder: number | null;
  number: number | null;
  /** The camera's wall clock read as if it were UTC, in ms; null when the file had none. */
  capturedAt: number | null;
  slateToken: string | null;
}

export interface MatchSitting {
  id: string;
  personId: string;
  stationId: string;
  slateToken: string;
  firstFrame: number | null;
  lastFrame: number | null;
  startedAt: number;
  finishedAt: number | null;
}

export interface ManualDecision {
  frameId: string;
  /** The person the frame was given to by hand; null marks a test frame: it belongs to nobody. */
  personId: string | null;
  /** That person's sitting, when they have one (a split may give frames to someone without). */
  sittingId: string | null;
}

export type MatchReason =
  | 'manual'
  | 'manual_test_frame'
  | 'slate'
  | 'after_slate'
  | 'capture_time'
  | 'frame_number'
  | 'conflict'
  | 'leftover';

export interface FrameMatch {
  frameId: string;
  sittingId: string | null;
  personId: string | null;
  reason: MatchReason;
  confidence: number;
  /** For a conflict: the sittings the evidence points at. */
  candidates?: string[];
  /** Under a manual decision: what the evidence alone would have said. */
  automatic?: FrameMatch;
}

export interface MatchResult {
  matches: FrameMatch[];
  conflicts: FrameMatch[];
  leftovers: FrameMatch[];
  /** Per camera: the estimated camera-clock-minus-server-clock offset in ms, when known. */
  cameraOffsets: Record<string, number>;
  /** Sittings whose typed first frame disagrees with their slate frame's number. */
  typedFrameMismatches: Array<{ sittingId: string; typed: number; slateFrame: number }>;
}

export function cameraKey(frame: MatchFrame) {
  return frame.cameraSerial ?? `station:${frame.stationId}`;
}

/*
 * Frame and sitting ids are the database's primary keys: unique within a day. The matcher works
 * on frames by their index in `frames` and on sittings by their position at their station, so
 * that the walk over a day of 100,000 frames builds no strings and few arrays.
 */
export function matchFrames(input: {
  frames: MatchFrame[];
  sittings: MatchSitting[];
  manual?: ManualDecision[];
  /**
   * A camera with neither slates nor typed frame numbers is taken to run on the office's wall
   * clock: this is that clock minus UTC in ms (cameras are usually set to local time).
   */
  assumedCameraOffset?: number;
}): MatchResult {
  const { frames, sittings } = input;
  let typedAt: Map<string, MatchSitting> | undefined;
  const cameraOffsets: Record<string, number> = {};
  const walk: Walk = {
    frames,
    sittings,
    index: indexSittings(sittings),
    results: new Array<FrameMatch>(frames.length),
    unsure: [],
    typedFrameMismatches: [],
    byTime: new Int32Array(LOOK_BACK),
  };
  for (const [camera, list] of framesByCamera(frames)) {
    // 1. The camera's frames in shooting order, its slates, and its clock offset from them (a
    // median resists outliers); each camera's evidence is its own.
    const ordered = shootingOrder(frames, list);
    const slates = cameraSlates(walk, ordered);
    const offset =
      median(slates.differences) ??
      // No slate at all: typed first frames give the offset instead.
      typedOffset(frames, list, (typedAt ??= typedFirstFrames(sittings))) ??
      input.assumedCameraOffset ??
      null;
    if (offset !== null) cameraOffsets[camera] = offset;
    // 2. Its frames in shooting order: slates open runs, time and numbers fill in.
    walkCamera(walk, ordered, slates, cameraOffsets[camera]);
  }
  const { results, unsure, typedFrameMismatches } = walk;

  // 3. People's own decisions always win.
  if (input.manual && input.manual.length > 0) applyManual(input.manual, frames, sittings, results);

  // Conflicts and leftovers in the frames' order; a manual decision settles a frame.
  const conflicts: FrameMatch[] = [];
  const leftovers: FrameMatch[] = [];
  for (const index of unsure.sort((a, b) => a - b)) {
    const match = results[index]!;
    if (match.reason === 'conflict') conflicts.push(match);
    else if (match.reason === 'leftover') leftovers.push(match);
  }
  return { matches: results, conflicts, leftovers, cameraOffsets, typedFrameMismatches };
}

/** Sittings by station and typed first frame, for cameras with no slate to go by. */
function typedFirstFrames(sittings: MatchSitting[]) {
  const typedAt = new Map<string, MatchSitting>();
  for (const sitting of sittings) {
    if (sitting.firstFrame !== null)
      typedAt.set(`${sitting.stationId}:${sitting.firstFrame}`, sitting);
  }
  return typedAt;
}
