import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import {
  matchFrames,
  type MatchFrame,
  type MatchSitting,
} from '../../server/modules/matching/match-frames';
import { cleanDay, generateDay, scoreMatches, type DayFaults } from '../support/generated-day';

// The matcher's rules are the product's own; the day's facts behind the generated days are
// common practice (5-minute sittings, 10-25 frames each, a slate first) and DCF numbering
// (JEITA CP-3461: 0001-9999, then 0001 in the next folder; a card reset restarts at 100/0001).
const seeded = (seed: number) => {
  let state = seed % 2147483646 || 1;
  return () => (state = (state * 16807) % 2147483647) / 2147483647;
};

const camerasAndCards = fc.record({
  clockOffsetMs: fc.integer({ min: -2 * 3_600_000, max: 2 * 3_600_000 }),
  driftMsPerHour: fc.integer({ min: -30_000, max: 30_000 }),
  rollover: fc.boolean(),
  cardReset: fc.boolean(),
  testFrames: fc.integer({ min: 0, max: 6 }),
  seed: fc.integer({ min: 1, max: 2_000_000_000 }),
});

describe('matching frames to sittings', () => {
  it('gets every frame right when every sitting has a slate, whatever the clocks and cards do', () => {
    fc.assert(
      fc.property(camerasAndCards, ({ seed, ...faults }) => {
        const day = generateDay({ ...cleanDay, ...faults }, seeded(seed));
        const score = scoreMatches(matchFrames(day), day.truth);
        expect(score.right).toBe(score.total);
      }),
      { numRuns: 200 },
    );
  });

  it('stays at least 99.5 % right with every fault at once, and never wrong on more than 0.5 %', () => {
    let right = 0;
    let total = 0;
    fc.assert(
      fc.property(camerasAndCards, ({ seed, ...faults }) => {
        const everything: DayFaults = {
          ...cleanDay,
          ...faults,
          // A third of the slates missing, clocks off by an hour and a few minutes, a reset, a
          // rollover and typed first frames with a digit wrong, all on one day.
          missingSlates: 1 / 3,
          clockOffsetMs: 3_600_000 + (faults.clockOffsetMs % 300_000),
          rollover: true,
          cardReset: true,
          typos: 0.2,
        };
        const day = generateDay(everything, seeded(seed));
        const score = scoreMatches(matchFrames(day), day.truth);
        expect(score.wrongShare).toBeLessThanOrEqual(0.005);
        right += score.right;
        total += score.total;
      }),
      { numRuns: 200 },
    );
    expect(right / total).toBeGreaterThanOrEqual(0.995);
  });

  it('matches every frame the same whatever order the files were read in', () => {
    // Cards are usually read in shooting order; the matcher must not depend on it.
    fc.assert(
      fc.property(camerasAndCards, fc.boolean(), ({ seed, ...faults }, missing) => {
        const day = generateDay(
          { ...cleanDay, ...faults, missingSlates: missing ? 1 / 3 : 0, typos: 0.2 },
          seeded(seed),
        );
        const random = seeded(seed + 1);
        const shuffled = day.frames
          .map((frame) => ({ frame, key: random() }))
          .sort((a, b) => a.key - b.key)
          .map(({ frame }) => frame);
        const inOrder = matchFrames(day);
        const outOfOrder = matchFrames({ ...day, frames: shuffled });
        const byFrame = (matches: Array<{ frameId: string }>) =>
          new Map(matches.map((match) => [match.frameId, match]));
        expect(byFrame(outOfOrder.matches)).toEqual(byFrame(inOrder.matches));
        expect(outOfOrder.cameraOffsets).toEqual(inOrder.cameraOffsets);
      }),
      { numRuns: 100 },
    );
  });

  const sitting = (
    id: string,
    startedAt: number,
    extra: Partial<MatchSitting> = {},
  ): MatchSitting => ({
    id,
    personId: `person-${id}`,
    stationId: 'a',
    slateToken: `SLATE${id}`.padEnd(26, 'Q'),
    firstFrame: null,
    lastFrame: null,
    startedAt,
    finishedAt: startedAt + 4 * 60_000,
    ...extra,
  });
  const frame = (
    id: string,
    number: number,
    capturedAt: number | null,
    extra: Partial<MatchFrame> = {},
  ): MatchFrame => ({
    id,
    stationId: 'a',
    cameraSerial: 'CV-1',
    folder: 100,
    number,
    capturedAt,
    slateToken: null,
    ...extra,
  });
  const nine = Date.UTC(2027, 2, 4, 9, 0, 0);

  it('leaves test frames before the first sitting over, never forcing them onto someone', () => {
    const first = sitting('one', nine);
    const result = matchFrames({
      sittings: [first],
      frames: [
        frame('test', 1, nine - 8 * 60_000),
        frame('slate', 2, nine + 10_000, { slateToken: first.slateToken }),
        frame('shot', 3, nine + 20_000),
        frame('after', 4, nine + 30 * 60_000),
      ],
    });
    // Test frames before the first sitting and frames long after the last are both left over.
    expect(result.leftovers.map((match) => match.frameId)).toEqual(['test', 'after']);
    expect(result.matches.find((match) => match.frameId === 'shot')?.personId).toBe('person-one');
  });

  it('takes a camera with no slate and no typed frame to run on the office clock', () => {
    // The office is an hour ahead of UTC; the camera's clock reads local wall time.
    const hour = 3_600_000;
    const one = sitting('one', nine, { firstFrame: null });
    const two = sitting('two', nine + 5 * 60_000, { firstFrame: null });
    const frames = [frame('a', 10, nine + hour + 30_000), frame('b', 11, nine + hour + 6 * 60_000)];
    const assumed = matchFrames({ sittings: [one, two], frames, assumedCameraOffset: hour });
    expect(assumed.matches.map((match) => match.sittingId)).toEqual(['one', 'two']);
    expect(assumed.cameraOffsets).toEqual({ 'CV-1': hour });
    // Without the assumption there is no clock to go by: nothing is forced onto anyone.
    const unknown = matchFrames({ sittings: [one, two], frames });
    expect(unknown.matches.every((match) => match.sittingId === null)).toBe(true);
  });

  it('reports a typed first frame that disagrees with the slate, and the slate wins', () => {
    const first = sitting('one', nine, { firstFrame: 4510 });
    const result = matchFrames({
      sittings: [first],
      frames: [
        frame('slate', 451, nine + 10_000, { slateToken: first.slateToken }),
        frame('next', 452, nine + 15_000),
      ],
    });
    expect(result.typedFrameMismatches).toEqual([
      { sittingId: 'one', typed: 4510, slateFrame: 451 },
    ]);
    expect(result.matches.every((match) => match.sittingId === 'one')).toBe(true);
  });

  it('makes a frame that two sittings could own a conflict with both candidates', () => {
    // An earlier slate gives the camera's offset (zero); later, two sittings were recorded
    // overlapping at one station and the frame between has no slate: either could own it.
    const zero = sitting('zero', nine - 10 * 60_000);
    const one = sitting('one', nine);
    const two = sitting('two', nine + 2 * 60_000);
    const result = matchFrames({
      sittings: [zero, one, two],
      frames: [
        frame('slate', 1, zero.startedAt, { slateToken: zero.slateToken }),
        frame('both', 30, nine + 3 * 60_000),
      ],
    });
    expect(result.conflicts).toEqual([
      expect.objectContaining({ frameId: 'both', sittingId: null, candidates: ['one', 'two'] }),
    ]);
  });

  it('keeps manual decisions: a frame moved by hand and a frame marked as a test frame', () => {
    const one = sitting('one', nine);
    const two = sitting('two', nine + 5 * 60_000);
    const result = matchFrames({
      sittings: [one, two],
      frames: [
        frame('slate', 1, nine + 10_000, { slateToken: one.slateToken }),
        frame('moved', 2, nine + 20_000),
        frame('test', 3, nine + 30_000),
      ],
      manual: [
        { frameId: 'moved', personId: two.personId, sittingId: 'two' },
        { frameId: 'test', personId: null, sittingId: null },
        { frameId: 'gone', personId: two.personId, sittingId: 'two' },
      ],
    });
    // A decision about a frame no longer on the day is ignored, not invented into a match.
    expect(result.matches.map((match) => match.frameId)).toEqual(['slate', 'moved', 'test']);
    expect(result.matches.find((match) => match.frameId === 'moved')).toMatchObject({
      sittingId: 'two',
      personId: two.personId,
      reason: 'manual',
      // What the evidence alone says is kept, so an undo or a re-run can show it.
      automatic: { sittingId: 'one', reason: 'after_slate' },
    });
    expect(result.matches.find((match) => match.frameId === 'test')).toMatchObject({
      sittingId: null,
      reason: 'manual_test_frame',
    });
  });

  it('estimates each camera clock’s offset from its slates with a median (an outlier does not move it)', () => {
    const sittings = [0, 1, 2, 3, 4].map((index) =>
      sitting(`s${index}`, nine + index * 5 * 60_000),
    );
    const offset = 3_600_000 + 120_000; // summer time forgotten, and two minutes of drift
    const frames = sittings.map((each, index) =>
      frame(
        `slate${index}`,
        index + 1,
        each.startedAt + offset + (index === 4 ? 40 * 60_000 : 10_000),
        {
          slateToken: each.slateToken,
        },
      ),
    );
    expect(matchFrames({ sittings, frames }).cameraOffsets['CV-1']).toBe(offset + 10_000);
  });
});
