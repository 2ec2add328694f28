import type {
  FrameMatch,
  MatchFrame,
  MatchReason,
  MatchResult,
  MatchSitting,
} from './match-frames';
import { NearestSlates } from './match-offsets';
import {
  firstFramesAt,
  noStation,
  sittingsAt,
  WINDOW_SLACK,
  type SittingIndex,
  type Station,
} from './match-stations';

/*
 * The walk over one camera's frames in shooting order: slates open runs, time and numbers fill
 * in. It is the matcher's hot loop, kept in small functions so that the engine optimises each
 * early in a run; frames are known by their index in `frames`, sittings by their position at
 * their station.
 */

/** What the walks over a day's cameras share: the day, its index, and what they have found. */
export interface Walk {
  frames: MatchFrame[];
  sittings: MatchSitting[];
  index: SittingIndex;
  /** By frame index. */
  results: FrameMatch[];
  /** Frames left as conflicts or leftovers, by index. */
  unsure: number[];
  typedFrameMismatches: MatchResult['typedFrameMismatches'];
  /** Room for the sittings a corrected time points at, as positions at their station. */
  byTime: Int32Array;
}

/** A camera's slates: where they are in its shooting order and whose they are. */
export interface CameraSlates {
  slatedAt: number[];
  /** Each slate's sitting, by index in `sittings`. */
  slated: number[];
  /** The slates with a capture time, and each one's camera-minus-server clock difference. */
  timedAt: number[];
  differences: number[];
}

export function cameraSlates(walk: Walk, ordered: number[]): CameraSlates {
  const slates: CameraSlates = { slatedAt: [], slated: [], timedAt: [], differences: [] };
  for (let position = 0; position < ordered.length; position += 1) {
    const frame = walk.frames[ordered[position]!]!;
    const sitting = frame.slateToken ? walk.index.byToken.get(frame.slateToken) : undefined;
    if (sitting === undefined) continue;
    slates.slatedAt.push(position);
    slates.slated.push(sitting);
    if (frame.capturedAt !== null) {
      slates.timedAt.push(position);
      slates.differences.push(frame.capturedAt - walk.sittings[sitting]!.startedAt);
    }
  }
  return slates;
}

/** `fallback`: the camera's overall offset, used when it has too few slates to go by nearby. */
export function walkCamera(
  walk: Walk,
  ordered: number[],
  slates: CameraSlates,
  fallback: number | undefined,
) {
  const { frames, sittings, results } = walk;
  const { slatedAt, slated } = slates;
  const nearest = NearestSlates.of(slates.timedAt, slates.differences);
  let run: MatchSitting | null = null;
  let runStation = noStation;
  let runPlace = 0;
  let nextSlate = 0; // the first slate at or after the position, in `slatedAt`
  let stationId: string | undefined;
  let station = noStation;
  for (let position = 0; position < ordered.length; position += 1) {
    const index = ordered[position]!;
    const frame = frames[index]!;
    const local = nearest ? nearest.at(position) : fallback;
    const time = frame.capturedAt === null || local === undefined ? null : frame.capturedAt - local;
    if (slatedAt[nextSlate] === position) {
      const slateIndex = slated[nextSlate]!;
      nextSlate += 1;
      run = sittings[slateIndex]!;
      runStation = walk.index.stationOf[slateIndex]!;
      runPlace = walk.index.placeOf[slateIndex]!;
      slate(walk, frame, index, run);
      continue;
    }
    // A run looks for sittings at its own station, whatever station the frame names.
    const here: string = run?.stationId ?? frame.stationId;
    if (here !== stationId) {
      stationId = here;
      station = walk.index.stations.get(here) ?? noStation;
    }
    let found = -1; // how many sittings the corrected time points at, once looked up
    if (run) {
      // The frames after a slate are its sitting's until the next slate, as long as the
      // corrected clock does not put them clearly past the sitting's end. When the next slate
      // is the very next sitting at this station, nothing lies between: every frame up to it
      // is this sitting's, whatever the clock says.
      const upcoming = slated[nextSlate];
      const end = runStation.ends[runPlace]!;
      let stillHere =
        time === null ||
        time <= end ||
        (upcoming !== undefined && sittings[upcoming] === runStation.sittings[runPlace + 1]);
      if (!stillHere && time !== null && time <= end + WINDOW_SLACK) {
        found = sittingsAt(station, time, walk.byTime);
        stillHere = onlyThis(walk, station, found, run);
      }
      if (stillHere) {
        results[index] = matched(frame, run, 'after_slate', 0.95);
        continue;
      }
      run = null;
    }
    if (found < 0) found = time === null ? 0 : sittingsAt(station, time, walk.byTime);
    const opened = byTimeOrNumber(walk, index, station, time, found);
    if (opened >= 0) {
      run = station.sittings[opened]!;
      runStation = station;
      runPlace = opened;
    }
  }
}

function slate(walk: Walk, frame: MatchFrame, index: number, sitting: MatchSitting) {
  walk.results[index] = matched(frame, sitting, 'slate', 1);
  if (sitting.firstFrame !== null && frame.number !== null && sitting.firstFrame !== frame.number) {
    walk.typedFrameMismatches.push({
      sittingId: sitting.id,
      typed: sitting.firstFrame,
      slateFrame: frame.number,
    });
  }
}

/** Whether the `found` sittings in `walk.byTime` are all the run's own. */
function onlyThis(walk: Walk, station: Station, found: number, run: MatchSitting) {
  for (let candidate = 0; candidate < found; candidate += 1) {
    if (station.sittings[walk.byTime[candidate]!]!.id !== run.id) return false;
  }
  return true;
}

/**
 * A frame outside any slate run, with the `found` sittings its corrected time points at in
 * `walk.byTime`. A typed first frame at the station opens a run when only one sitting there has
 * it (among those the time points at, when there is a time): returns that sitting's position,
 * else -1, having placed the frame by its time, as a conflict, or as a leftover.
 */
function byTimeOrNumber(
  walk: Walk,
  index: number,
  station: Station,
  time: number | null,
  found: number,
): number {
  const frame = walk.frames[index]!;
  const { byTime } = walk;
  let typed = -1;
  let typedCount = 0;
  if (frame.number !== null && time === null) {
    const all = firstFramesAt(station).get(frame.number);
    typedCount = all?.length ?? 0;
    if (typedCount === 1) typed = station.sittings.indexOf(all![0]!);
  } else if (frame.number !== null) {
    for (let candidate = 0; candidate < found; candidate += 1) {
      const sitting = station.sittings[byTime[candidate]!]!;
      if (sitting.firstFrame !== null && sitting.firstFrame === frame.number) {
        typedCount += 1;
        typed = byTime[candidate]!;
      }
    }
  }
  if (typedCount === 1) {
    walk.results[index] = matched(frame, station.sittings[typed]!, 'frame_number', 0.85);
    return typed;
  }
  if (found === 1) {
    walk.results[index] = matched(frame, station.sittings[byTime[0]!]!, 'capture_time', 0.8);
    return -1;
  }
  if (found > 1) {
    const candidates: string[] = [];
    for (let candidate = 0; candidate < found; candidate += 1) {
      candidates.push(station.sittings[byTime[candidate]!]!.id);
    }
    walk.results[index] = conflict(frame, candidates);
  } else walk.results[index] = unmatched(frame);
  walk.unsure.push(index);
  return -1;
}

function matched(
  frame: MatchFrame,
  sitting: MatchSitting,
  reason: MatchReason,
  confidence: number,
): FrameMatch {
  return {
    frameId: frame.id,
    sittingId: sitting.id,
    personId: sitting.personId,
    reason,
    confidence,
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

function unmatched(frame: MatchFrame): FrameMatch {
  return { frameId: frame.id, sittingId: null, personId: null, reason: 'leftover', confidence: 0 };
}
