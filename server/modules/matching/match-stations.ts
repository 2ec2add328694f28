import type { MatchSitting } from './match-frames';

/**
 * The sittings of a day laid out per station for the matcher's hot loop: sorted by start, with
 * their windows in typed arrays, so that finding the sittings around a moment allocates nothing.
 */
const MINUTE = 60_000;
/** How far outside its sitting's window a frame may fall and still be that sitting's. */
export const WINDOW_SLACK = 1.5 * MINUTE;
/** A sitting with no recorded finish is taken to last this long at most. */
const OPEN_SITTING = 10 * MINUTE;
/** How many earlier sittings at a station can still overlap a moment (overlaps are rare). */
export const LOOK_BACK = 8;

export interface Station {
  /** By start; sittings starting at the same moment keep their input order. */
  sittings: MatchSitting[];
  starts: Float64Array;
  /**
   * Each sitting's window on the server clock runs from its start to its finish; an open
   * sitting's, to the next start or for OPEN_SITTING, whichever comes first.
   */
  ends: Float64Array;
  /** Sittings by typed first frame, worked out only when a frame without a time needs it. */
  byFirstFrame?: Map<number, MatchSitting[]>;
}

export interface SittingIndex {
  stations: Map<string, Station>;
  /** By slate token: the sitting's index in the input (the last, should two share a token). */
  byToken: Map<string, number>;
  /** By the sitting's index in the input: its station, and its position there. */
  stationOf: Station[];
  placeOf: Int32Array;
}

export const noStation: Station = {
  sittings: [],
  starts: new Float64Array(0),
  ends: new Float64Array(0),
};

export function indexSittings(sittings: MatchSitting[]): SittingIndex {
  const byToken = new Map<string, number>();
  const lists = new Map<string, number[]>();
  sittings.forEach((sitting, index) => {
    byToken.set(sitting.slateToken, index);
    const list = lists.get(sitting.stationId);
    if (list) list.push(index);
    else lists.set(sitting.stationId, [index]);
  });
  const stations = new Map<string, Station>();
  const stationOf = new Array<Station>(sittings.length);
  const placeOf = new Int32Array(sittings.length);
  for (const [stationId, list] of lists) {
    // Array sort is stable: sittings starting together stay in input order.
    list.sort((a, b) => sittings[a]!.startedAt - sittings[b]!.startedAt);
    const station: Station = {
      sittings: list.map((index) => sittings[index]!),
      starts: new Float64Array(list.length),
      ends: new Float64Array(list.length),
    };
    station.sittings.forEach((sitting, position) => {
      const next = station.sittings[position + 1];
      station.starts[position] = sitting.startedAt;
      station.ends[position] =
        sitting.finishedAt ??
        Math.min(next?.startedAt ?? Infinity, sitting.startedAt + OPEN_SITTING);
      stationOf[list[position]!] = station;
      placeOf[list[position]!] = position;
    });
    stations.set(stationId, station);
  }
  return { stations, byToken, stationOf, placeOf };
}

/** A station's sittings by typed first frame (kept on the station once worked out). */
export function firstFramesAt(station: Station): Map<number, MatchSitting[]> {
  if (station.byFirstFrame) return station.byFirstFrame;
  const byNumber = new Map<number, MatchSitting[]>();
  for (const sitting of station.sittings) {
    const typed = sitting.firstFrame;
    // NaN equals nothing under ===, though a Map would find it.
    if (typed === null || Number.isNaN(typed)) continue;
    const list = byNumber.get(typed);
    if (list) list.push(sitting);
    else byNumber.set(typed, [sitting]);
  }
  station.byFirstFrame = byNumber;
  return byNumber;
}

/**
 * The sittings at a station whose window holds a frame's corrected time: those whose window
 * holds it exactly when there are any, else those within the slack of their window's edges.
 * Writes their positions in `station.sittings` into `into`, in start order; returns how many.
 */
export function sittingsAt(station: Station, time: number, into: Int32Array): number {
  const { starts, ends } = station;
  // Sittings are sorted by start: find the last that starts before the time (plus slack),
  // then look back over the few whose windows could still reach it.
  let low = 0;
  let high = starts.length;
  const latest = time + WINDOW_SLACK;
  while (low < high) {
    const middle = (low + high) >> 1;
    if (starts[middle]! <= latest) low = middle + 1;
    else high = middle;
  }
  const from = Math.max(0, low - LOOK_BACK);
  let count = 0;
  for (let index = from; index < low; index += 1) {
    if (time >= starts[index]! && time <= ends[index]!) into[count++] = index;
  }
  if (count > 0) return count;
  for (let index = from; index < low; index += 1) {
    if (time >= starts[index]! - WINDOW_SLACK && time <= ends[index]! + WINDOW_SLACK)
      into[count++] = index;
  }
  return count;
}
