import { matchFrames } from '../server/modules/matching/match-frames';
import {
  cleanDay,
  generateDay,
  scoreMatches,
  type DayFaults,
} from '../tests/support/generated-day';
import type { Benchmark } from './run';

/**
 * `npm run bench -- matching`: a generated day of 8 stations and 6,000 sittings (about 110,000
 * frames, every fault at once) matched, against sorting the same frames by capture time in the
 * same run. Also prints how many frames each kind of fault leaves right, unsure and wrong.
 */
const seeded = (seed: number) => {
  let state = seed;
  return () => (state = (state * 16807) % 2147483647) / 2147483647;
};

const everything: DayFaults = {
  stations: 8,
  sittingsPerStation: 750,
  missingSlates: 1 / 3,
  clockOffsetMs: 3_600_000 + 150_000,
  driftMsPerHour: 15_000,
  rollover: true,
  cardReset: true,
  typos: 0.2,
  testFrames: 5,
};

const faultKinds: Record<string, Partial<DayFaults>> = {
  'all slates, clean': {},
  'clock an hour and minutes off, drifting': { clockOffsetMs: 3_780_000, driftMsPerHour: 20_000 },
  'rollover and card reset': { rollover: true, cardReset: true },
  'a third of the slates missing': { missingSlates: 1 / 3 },
  'first frames typed a digit wrong': { typos: 0.3 },
  'every fault at once': everything,
};

const benchmark: Benchmark = {
  name: 'matching',
  async run({ print }) {
    const day = generateDay(everything, seeded(4242));
    const rounds = 5;
    let best = Infinity;
    let baseline = Infinity;
    let score = scoreMatches({ matches: [] }, day.truth);
    for (let round = 0; round < rounds; round += 1) {
      const sortStarted = performance.now();
      const sorted = [...day.frames].sort((a, b) => (a.capturedAt ?? 0) - (b.capturedAt ?? 0));
      baseline = Math.min(baseline, performance.now() - sortStarted);
      if (sorted.length !== day.frames.length) throw new Error('sort lost frames');
      const started = performance.now();
      const result = matchFrames(day);
      best = Math.min(best, performance.now() - started);
      score = scoreMatches(result, day.truth);
    }
    print({
      bench: 'matching',
      frames: day.frames.length,
      sittings: day.sittings.length,
      ms: Math.round(best),
      baseline_ms: Math.round(baseline),
      ratio: Number((best / baseline).toFixed(2)),
      goal_ms: 1000,
      goal_ratio: 3,
      right_share: Number(score.rightShare.toFixed(4)),
      wrong_share: Number(score.wrongShare.toFixed(4)),
    });
    for (const [kind, faults] of Object.entries(faultKinds)) {
      const sample = generateDay(
        { ...cleanDay, stations: 4, sittingsPerStation: 100, ...faults },
        seeded(7),
      );
      const result = scoreMatches(matchFrames(sample), sample.truth);
      print({
        bench: 'matching-accuracy',
        fault: kind,
        frames: result.total,
        right_share: Number(result.rightShare.toFixed(4)),
        unsure: result.unsure,
        wrong: result.wrong,
      });
    }
  },
};

export default benchmark;
