import type { MatchFrame, MatchSitting } from './match-frames';

/** A camera's clock drifts: its offset is read from the slates nearest in shooting order. */
const NEAREST_SLATES = 7;

export function median(values: number[]): number | null {
  if (values.length === 0) return null;
  const sorted = [...values].sort((a, b) => a - b);
  const middle = Math.floor(sorted.length / 2);
  return sorted.length % 2 === 1 ? sorted[middle]! : (sorted[middle - 1]! + sorted[middle]!) / 2;
}

/**
 * A camera without slates: its offset from the frames whose numbers were typed as a sitting's
 * first frame at their station, or null.
 */
export function typedOffset(
  frames: MatchFrame[],
  camera: number[],
  typedAt: Map<string, MatchSitting>,
): number | null {
  const typed: number[] = [];
  for (const index of camera) {
    const frame = frames[index]!;
    const sitting = typedAt.get(`${frame.stationId}:${frame.number}`);
    if (sitting && frame.capturedAt !== null) typed.push(frame.capturedAt - sitting.startedAt);
  }
  return median(typed);
}

/**
 * The median offset of the slates nearest a position in a camera's shooting order, asked for
 * position by position (ties in distance go to the earlier slate). Null from `of` when the
 * camera has too few slates for that, so its overall offset stands. The nearest slates are
 * always a run of consecutive slates, and that run only moves forward as the position does, so
 * each run's median is worked out once rather than once per frame.
 */
export class NearestSlates {
  private readonly medians: Float64Array;
  private first = 0;

  private constructor(
    private readonly positions: number[],
    offsets: number[],
  ) {
    this.medians = new Float64Array(positions.length - NEAREST_SLATES + 1);
    const run = new Float64Array(NEAREST_SLATES);
    for (let first = 0; first < this.medians.length; first += 1) {
      // An insertion sort of the run: the middle value is the median of an odd count.
      for (let taken = 0; taken < NEAREST_SLATES; taken += 1) {
        const offset = offsets[first + taken]!;
        let at = taken;
        for (; at > 0 && run[at - 1]! > offset; at -= 1) run[at] = run[at - 1]!;
        run[at] = offset;
      }
      this.medians[first] = run[NEAREST_SLATES >> 1]!;
    }
  }

  /** `positions` ascending, of the slates with a capture time; `offsets` theirs. */
  static of(positions: number[], offsets: number[]): NearestSlates | null {
    return positions.length < NEAREST_SLATES ? null : new NearestSlates(positions, offsets);
  }

  /** Call with positions in ascending order. */
  at(position: number): number {
    const { positions, medians } = this;
    // Move on while the slate just past the run is strictly nearer than the run's first.
    while (
      this.first + 1 < medians.length &&
      position - positions[this.first]! > positions[this.first + NEAREST_SLATES]! - position
    ) {
      this.first += 1;
    }
    return medians[this.first]!;
  }
}
