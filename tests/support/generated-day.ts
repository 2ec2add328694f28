import type { MatchFrame, MatchSitting } from '../../server/modules/matching/match-frames';

/**
 * A generated shoot day for the matcher: stations shooting 5-minute sittings, each with a slate
 * frame and 10-25 frames, cameras whose clocks are off, DCF numbers that roll over and reset,
 * slates left out and first frames typed wrong, as the options ask. `truth` says whose each
 * frame really is (null for test frames before the first sitting).
 */
export interface DayFaults {
  stations: number;
  sittingsPerStation: number;
  /** Share of sittings whose slate was not photographed. */
  missingSlates: number;
  /** Camera clock minus server clock, ms, per station (drift is added on top). */
  clockOffsetMs: number;
  /** Drift of the camera clock over the day, ms per hour. */
  driftMsPerHour: number;
  /** Start numbering near 9999 so the card rolls over into the next folder. */
  rollover: boolean;
  /** Reset the card's numbering to 100/0001 halfway through the day. */
  cardReset: boolean;
  /** Share of typed first frames with one digit wrong. */
  typos: number;
  /** Test frames shot before the first sitting. */
  testFrames: number;
}

export const cleanDay: DayFaults = {
  stations: 2,
  sittingsPerStation: 20,
  missingSlates: 0,
  clockOffsetMs: 0,
  driftMsPerHour: 0,
  rollover: false,
  cardReset: false,
  typos: 0,
  testFrames: 0,
};

export function generateDay(faults: DayFaults, random: () => number) {
  const frames: MatchFrame[] = [];
  const sittings: MatchSitting[] = [];
  const truth = new Map<string, string | null>();
  const dayStart = Date.UTC(2027, 2, 4, 9, 0, 0);
  const between = (low: number, high: number) => low + Math.floor(random() * (high - low + 1));
  let sequence = 0;

  for (let station = 0; station < faults.stations; station += 1) {
    const stationId = `station-${station}`;
    const serial = `CV-${1000 + station}`;
    let folder = 100;
    let number = faults.rollover ? 9990 - between(0, 40) : between(1, 200);
    const cameraClock = (serverTime: number) =>
      serverTime +
      faults.clockOffsetMs +
      ((serverTime - dayStart) / 3_600_000) * faults.driftMsPerHour;
    const shoot = (serverTime: number, slateToken: string | null, owner: string | null) => {
      const id = `f${(sequence += 1)}`;
      frames.push({
        id,
        stationId,
        cameraSerial: serial,
        folder,
        number,
        capturedAt: cameraClock(serverTime),
        slateToken,
      });
      truth.set(id, owner);
      const shotNumber = number;
      if (number === 9999) {
        folder += 1;
        number = 1;
      } else number += 1;
      // Frames deleted in camera leave gaps now and then.
      if (random() < 0.05) number = Math.min(9999, number + 1);
      return shotNumber;
    };
    let previousFinish = 0;
    for (let index = 0; index < faults.testFrames; index += 1) {
      shoot(dayStart - 10 * 60_000 + index * 20_000, null, null);
    }
    for (let index = 0; index < faults.sittingsPerStation; index += 1) {
      if (faults.cardReset && index === Math.floor(faults.sittingsPerStation / 2)) {
        folder = 100;
        number = 1;
      }
      // Sittings run back to back when the day is busy: the next starts soon after the last.
      const startedAt = Math.max(
        dayStart + index * 5 * 60_000 + between(0, 30_000),
        previousFinish + between(10_000, 60_000),
      );
      const id = `s${station}-${index}`;
      const slateToken = `TOKEN${station}X${index}`.padEnd(26, 'A');
      const slated = random() >= faults.missingSlates;
      let time = startedAt + between(5_000, 20_000);
      const first = shoot(time, slated ? slateToken : null, id);
      const count = between(10, 25);
      for (let shot = 0; shot < count; shot += 1) {
        time += between(3_000, 12_000);
        shoot(time, null, id);
      }
      const typed = random() < faults.typos ? mistype(first, random) : first;
      const finishedAt = Math.max(time + between(5_000, 30_000), startedAt + 60_000);
      previousFinish = finishedAt;
      sittings.push({
        id,
        personId: `person-${station}-${index}`,
        stationId,
        slateToken,
        firstFrame: typed,
        lastFrame: null,
        startedAt,
        finishedAt,
      });
    }
  }
  return { frames, sittings, truth };
}

/** One digit of a four-digit number typed wrong (never 0000). */
function mistype(value: number, random: () => number): number {
  const digits = String(value).padStart(4, '0').split('');
  const position = Math.floor(random() * 4);
  const current = Number(digits[position]);
  digits[position] = String((current + 1 + Math.floor(random() * 9)) % 10);
  return Math.max(1, Number(digits.join('')));
}

export function scoreMatches(
  result: { matches: Array<{ frameId: string; sittingId: string | null }> },
  truth: Map<string, string | null>,
) {
  let right = 0;
  let wrong = 0;
  let unsure = 0;
  for (const match of result.matches) {
    const expected = truth.get(match.frameId) ?? null;
    if (match.sittingId === expected) right += 1;
    else if (match.sittingId === null) unsure += 1;
    else wrong += 1;
  }
  const total = result.matches.length;
  return { total, right, wrong, unsure, rightShare: right / total, wrongShare: wrong / total };
}
