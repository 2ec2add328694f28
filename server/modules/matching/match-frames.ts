/**
 * Ties every frame of a day to a sitting, or leaves it over: a pure function, no database.
 * Evidence, strongest first: a manual decision; a slate (the frame shows a sitting's QR code,
 * and the frames after it follow until the next slate); the capture time corrected by the
 * camera's estimated clock offset, placed in a sitting's window at the camera's station; the
 * frame number typed at the console. Anything not certain is a conflict or a leftover, never a
 * guess.
 */
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

const MINUTE = 60_000;
/** How far outside its sitting's window a frame may fall and still be that sitting's. */
const WINDOW_SLACK = 1.5 * MINUTE;
/** A sitting with no recorded finish is taken to last this long at most. */
const OPEN_SITTING = 10 * MINUTE;
/** How many earlier sittings at a station can still overlap a moment (overlaps are rare). */
const LOOK_BACK = 8;
/** A camera's clock drifts: its offset is read from the slates nearest in shooting order. */
const NEAREST_SLATES = 7;

export function cameraKey(frame: MatchFrame) {
  return frame.cameraSerial ?? `station:${frame.stationId}`;
}

function median(values: number[]): number | null {
  if (values.length === 0) return null;
  const sorted = [...values].sort((a, b) => a - b);
  const middle = Math.floor(sorted.length / 2);
  return sorted.length % 2 === 1 ? sorted[middle]! : (sorted[middle - 1]! + sorted[middle]!) / 2;
}

/** Each sitting's window on the server clock: start to finish, or to the next start. */
function sittingWindows(sittings: MatchSitting[]) {
  const byStation = new Map<string, MatchSitting[]>();
  for (const sitting of sittings) {
    const list = byStation.get(sitting.stationId) ?? [];
    list.push(sitting);
    byStation.set(sitting.stationId, list);
  }
  const windows = new Map<string, { start: number; end: number }>();
  for (const list of byStation.values()) {
    list.sort((a, b) => a.startedAt - b.startedAt);
    list.forEach((sitting, index) => {
      const next = list[index + 1];
      const end =
        sitting.finishedAt ??
        Math.min(next?.startedAt ?? Infinity, sitting.startedAt + OPEN_SITTING);
      windows.set(sitting.id, { start: sitting.startedAt, end });
    });
  }
  return { byStation, windows };
}

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
  const sittingByToken = new Map(input.sittings.map((sitting) => [sitting.slateToken, sitting]));
  const sittingById = new Map(input.sittings.map((sitting) => [sitting.id, sitting]));
  const { byStation, windows } = sittingWindows(input.sittings);
  const decided = new Map<string, FrameMatch>();
  const nextSittingAt = new Map<string, MatchSitting | undefined>();
  for (const list of byStation.values()) {
    list.forEach((sitting, index) => nextSittingAt.set(sitting.id, list[index + 1]));
  }

  // 1. Cameras, and each camera's clock offset from its slates (a median resists outliers).
  const cameras = new Map<string, MatchFrame[]>();
  for (const frame of input.frames) {
    const list = cameras.get(cameraKey(frame)) ?? [];
    list.push(frame);
    cameras.set(cameraKey(frame), list);
  }
  const typedAt = new Map<string, MatchSitting>();
  for (const sitting of input.sittings) {
    if (sitting.firstFrame !== null)
      typedAt.set(`${sitting.stationId}:${sitting.firstFrame}`, sitting);
  }
  const cameraOffsets: Record<string, number> = {};
  const typedFrameMismatches: MatchResult['typedFrameMismatches'] = [];
  for (const [camera, frames] of cameras) {
    const differences = frames.flatMap((frame) => {
      const sitting = frame.slateToken ? sittingByToken.get(frame.slateToken) : undefined;
      return sitting && frame.capturedAt !== null ? [frame.capturedAt - sitting.startedAt] : [];
    });
    let offset = median(differences);
    if (offset === null) {
      // No slate at all: typed first frames give the offset instead.
      const typed = frames.flatMap((frame) => {
        const sitting = typedAt.get(`${frame.stationId}:${frame.number}`);
        return sitting && frame.capturedAt !== null ? [frame.capturedAt - sitting.startedAt] : [];
      });
      offset = median(typed) ?? input.assumedCameraOffset ?? null;
    }
    if (offset !== null) cameraOffsets[camera] = offset;
  }

  /**
   * Sittings at a station whose window holds the frame's corrected time: those whose window
   * holds it exactly when there are any, else those within the slack of their window's edges.
   */
  const sittingsAt = (stationId: string, time: number) => {
    const here = byStation.get(stationId) ?? [];
    // Sittings are sorted by start: find the last that starts before the time (plus slack),
    // then look back over the few whose windows could still reach it.
    let low = 0;
    let high = here.length;
    while (low < high) {
      const middle = (low + high) >> 1;
      if (here[middle]!.startedAt <= time + WINDOW_SLACK) low = middle + 1;
      else high = middle;
    }
    const near: MatchSitting[] = [];
    for (let index = low - 1; index >= 0 && index >= low - LOOK_BACK; index -= 1)
      near.push(here[index]!);
    const within = (sitting: MatchSitting, slack: number) => {
      const window = windows.get(sitting.id)!;
      return time >= window.start - slack && time <= window.end + slack;
    };
    const exact = near.filter((sitting) => within(sitting, 0)).reverse();
    return exact.length > 0
      ? exact
      : near.filter((sitting) => within(sitting, WINDOW_SLACK)).reverse();
  };

  const assign = (
    frame: MatchFrame,
    sitting: MatchSitting,
    reason: MatchReason,
    confidence: number,
  ) =>
    decided.set(frame.id, {
      frameId: frame.id,
      sittingId: sitting.id,
      personId: sitting.personId,
      reason,
      confidence,
    });

  // 2. Walk each camera's frames in shooting order: slates open runs, time and numbers fill in.
  for (const frames of cameras.values()) {
    const ordered = [...frames].sort(
      (a, b) =>
        (a.capturedAt ?? Infinity) - (b.capturedAt ?? Infinity) ||
        (a.folder ?? 0) - (b.folder ?? 0) ||
        (a.number ?? 0) - (b.number ?? 0),
    );
    let run: MatchSitting | null = null as MatchSitting | null;
    // Where the next slate in shooting order is, for each position.
    const nextSlate: Array<MatchSitting | undefined> = new Array(ordered.length);
    for (
      let index = ordered.length - 1, upcoming: MatchSitting | undefined;
      index >= 0;
      index -= 1
    ) {
      nextSlate[index] = upcoming;
      const token = ordered[index]!.slateToken;
      const slated = token ? sittingByToken.get(token) : undefined;
      if (slated) upcoming = slated;
    }
    const localOffset = localOffsets(
      ordered,
      sittingByToken,
      cameraOffsets[cameraKey(ordered[0]!)],
    );
    for (const [position, frame] of ordered.entries()) {
      const slate = frame.slateToken ? sittingByToken.get(frame.slateToken) : undefined;
      const offset = localOffset(position);
      const time =
        frame.capturedAt === null || offset === undefined ? null : frame.capturedAt - offset;
      if (slate) {
        run = slate;
        assign(frame, slate, 'slate', 1);
        if (
          slate.firstFrame !== null &&
          frame.number !== null &&
          slate.firstFrame !== frame.number
        ) {
          typedFrameMismatches.push({
            sittingId: slate.id,
            typed: slate.firstFrame,
            slateFrame: frame.number,
          });
        }
        continue;
      }
      const station: string = run?.stationId ?? frame.stationId;
      const byTime = time === null ? [] : sittingsAt(station, time);
      if (run) {
        // The frames after a slate are its sitting's until the next slate, as long as the
        // corrected clock does not put them clearly past the sitting's end.
        const window = windows.get(run.id)!;
        const current = run;
        // When the next slate is the very next sitting at this station, nothing lies between:
        // every frame up to it is this sitting's, whatever the clock says.
        const upcoming = nextSlate[position];
        const followedDirectly =
          upcoming !== undefined && upcoming === nextSittingAt.get(current.id);
        const stillHere =
          followedDirectly ||
          time === null ||
          time <= window.end ||
          (time <= window.end + WINDOW_SLACK &&
            byTime.every((sitting) => sitting.id === current.id));
        if (stillHere) {
          assign(frame, run, 'after_slate', 0.95);
          continue;
        }
        run = null;
      }
      // No slate run: a typed first frame at this station opens one.
      const typed: MatchSitting[] = (byStation.get(station) ?? []).filter(
        (sitting) =>
          sitting.firstFrame !== null &&
          sitting.firstFrame === frame.number &&
          (time === null || byTime.some((candidate) => candidate.id === sitting.id)),
      );
      const opened = typed.length === 1 ? typed[0] : undefined;
      if (opened) {
        run = opened;
        assign(frame, opened, 'frame_number', 0.85);
        continue;
      }
      if (byTime.length === 1) {
        assign(frame, byTime[0]!, 'capture_time', 0.8);
      } else if (byTime.length > 1) {
        decided.set(
          frame.id,
          conflict(
            frame,
            byTime.map((sitting) => sitting.id),
          ),
        );
      } else {
        decided.set(frame.id, {
          frameId: frame.id,
          sittingId: null,
          personId: null,
          reason: 'leftover',
          confidence: 0,
        });
      }
    }
  }

  // 3. People's own decisions always win.
  for (const decision of input.manual ?? []) {
    const automatic = decided.get(decision.frameId);
    if (!automatic) continue; // a decision about a frame that is no longer part of the day
    const sitting = decision.sittingId ? sittingById.get(decision.sittingId) : undefined;
    const personId = decision.personId ?? sitting?.personId ?? null;
    decided.set(decision.frameId, {
      frameId: decision.frameId,
      sittingId: personId !== null && sitting?.personId === personId ? sitting.id : null,
      personId,
      reason: personId === null ? 'manual_test_frame' : 'manual',
      confidence: 1,
      automatic,
    });
  }

  const matches = input.frames.map((frame) => decided.get(frame.id)!);
  return {
    matches,
    conflicts: matches.filter((match) => match.reason === 'conflict'),
    leftovers: matches.filter((match) => match.reason === 'leftover'),
    cameraOffsets,
    typedFrameMismatches,
  };
}

function conflict(frame: MatchFrame, candidates: string[]): FrameMatch {
  return {
    frameId: frame.id,
    sittingId: null,
    personId: null,
    reason: 'conflict',
    confidence: 0,
    candidates,
  };
}

/** For each position in a camera's shooting order: the median offset of the nearest slates. */
function localOffsets(
  ordered: MatchFrame[],
  sittingByToken: Map<string, MatchSitting>,
  fallback: number | undefined,
): (position: number) => number | undefined {
  const slates: Array<{ position: number; offset: number }> = [];
  ordered.forEach((frame, position) => {
    const sitting = frame.slateToken ? sittingByToken.get(frame.slateToken) : undefined;
    if (sitting && frame.capturedAt !== null) {
      slates.push({ position, offset: frame.capturedAt - sitting.startedAt });
    }
  });
  if (slates.length < NEAREST_SLATES) return () => fallback;
  return (position) => {
    let low = 0;
    let high = slates.length;
    while (low < high) {
      const middle = (low + high) >> 1;
      if (slates[middle]!.position < position) low = middle + 1;
      else high = middle;
    }
    let left = low - 1;
    let right = low;
    const picked: number[] = [];
    while (picked.length < NEAREST_SLATES && (left >= 0 || right < slates.length)) {
      const takeLeft =
        right >= slates.length ||
        (left >= 0 && position - slates[left]!.position <= slates[right]!.position - position);
      picked.push(takeLeft ? slates[left--]!.offset : slates[right++]!.offset);
    }
    return median(picked) ?? fallback;
  };
}
