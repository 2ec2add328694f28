import type { MatchChange } from '../../db/match-types';
import type {
  DayReview,
  DecisionActionName,
  MatchReasonName,
  ReviewFrame,
  ReviewSitter,
} from '../../schemas/matching';
import type { DayRecord } from '../days/days.repository';
import type { latestRun } from './matching.repository';
import type { EffectiveFrameRow, daySittings, peopleByIds } from './review.repository';

type SittingRow = Awaited<ReturnType<typeof daySittings>>[number];
type PersonRow = Awaited<ReturnType<typeof peopleByIds>>[number];
type RunRow = NonNullable<Awaited<ReturnType<typeof latestRun>>>;

/** What a frame is now: a person's decision over the evidence, or the evidence alone. */
export function effectiveMatch(
  frame: EffectiveFrameRow,
  personOfSitting: Map<string, string>,
): Pick<ReviewFrame, 'personId' | 'sittingId' | 'reason' | 'candidatePersonIds'> {
  if (frame.decisionAction === 'test_frame') {
    return { personId: null, sittingId: null, reason: 'manual_test_frame', candidatePersonIds: [] };
  }
  if (frame.decisionAction) {
    return {
      personId: frame.decidedPersonId,
      sittingId: frame.decidedSittingId,
      reason: 'manual',
      candidatePersonIds: [],
    };
  }
  if (!frame.autoReason) {
    return { personId: null, sittingId: null, reason: 'not_read_yet', candidatePersonIds: [] };
  }
  return {
    personId: frame.autoPersonId,
    sittingId: frame.autoSittingId,
    reason: frame.autoReason as MatchReasonName,
    candidatePersonIds: (frame.candidates ?? []).flatMap((sittingId) => {
      const personId = personOfSitting.get(sittingId);
      return personId ? [personId] : [];
    }),
  };
}

const countReason = (frames: Array<Pick<ReviewFrame, 'reason'>>, reason: MatchReasonName) =>
  frames.filter((frame) => frame.reason === reason).length;

/** The counts a coordinator may see: how far matching has got, no frames and no names. */
export function frameCounts(rows: EffectiveFrameRow[]) {
  const frames = rows.map((row) => effectiveMatch(row, new Map()));
  return {
    frames: frames.length,
    matched: frames.filter((frame) => frame.personId !== null).length,
    conflicts: countReason(frames, 'conflict'),
    leftovers: countReason(frames, 'leftover'),
    testFrames: countReason(frames, 'manual_test_frame'),
  };
}

export function buildReview(input: {
  day: DayRecord;
  frames: EffectiveFrameRow[];
  sittings: SittingRow[];
  extraPeople: PersonRow[];
  notPhotographed: Array<{ personId: string; name: string; employeeId: string | null }>;
  lastRun: RunRow | null;
  changedNames: Map<string, string>;
  changedPeople: PersonRow[];
  matching: boolean;
  lastChange: { changeId: string; action: DecisionActionName; frames: string } | null;
}): DayReview {
  const personOfSitting = new Map(input.sittings.map((sitting) => [sitting.id, sitting.personId]));
  const frames: ReviewFrame[] = input.frames.map((frame) => ({
    id: frame.id,
    stationId: frame.stationId,
    fileName: frame.cardPath.split('/').pop() ?? frame.cardPath,
    folder: frame.dcfFolder,
    number: frame.dcfNumber,
    capturedLocal: frame.capturedLocal,
    cameraSerial: frame.cameraSerial,
    hasThumbnail: frame.hasThumbnail,
    ...effectiveMatch(frame, personOfSitting),
  }));
  const framesOf = new Map<string, number>();
  for (const frame of frames) {
    if (frame.personId) framesOf.set(frame.personId, (framesOf.get(frame.personId) ?? 0) + 1);
  }
  // One entry per person, at their first sitting; people given frames by a split come last.
  const sitters: ReviewSitter[] = [];
  const seen = new Set<string>();
  for (const sitting of input.sittings) {
    if (seen.has(sitting.personId)) continue;
    seen.add(sitting.personId);
    sitters.push({
      personId: sitting.personId,
      sittingId: sitting.id,
      name: sitting.name,
      employeeId: sitting.employeeId,
      stationId: sitting.stationId,
      startedAt: sitting.startedAt.toISOString(),
      firstFrame: sitting.firstFrame,
      lastFrame: sitting.lastFrame,
      frames: framesOf.get(sitting.personId) ?? 0,
    });
  }
  for (const person of input.extraPeople) {
    const stationId = frames.find((frame) => frame.personId === person.id)?.stationId ?? null;
    sitters.push({
      personId: person.id,
      sittingId: null,
      name: person.name,
      employeeId: person.employeeId,
      stationId,
      startedAt: null,
      firstFrame: null,
      lastFrame: null,
      frames: framesOf.get(person.id) ?? 0,
    });
  }
  const count = (reason: MatchReasonName) => countReason(frames, reason);
  const names = new Map<string, string>(
    input.changedPeople.map((person) => [person.id, person.name]),
  );
  for (const sitter of sitters) names.set(sitter.personId, sitter.name);
  const decided = new Set(
    input.frames.filter((frame) => frame.decisionAction).map((frame) => frame.id),
  );
  const run = input.lastRun;
  return {
    dayId: input.day.id,
    dayDate: input.day.date,
    clientName: input.day.clientName,
    stations: input.day.stations.map((station) => ({ id: station.id, name: station.name })),
    counts: {
      frames: frames.length,
      matched: frames.filter((frame) => frame.personId !== null).length,
      conflicts: count('conflict'),
      leftovers: count('leftover'),
      testFrames: count('manual_test_frame'),
      notReadYet: count('not_read_yet'),
      sittersWithoutFrames: sitters.filter((sitter) => sitter.frames === 0).length,
      notPhotographed: input.notPhotographed.length,
    },
    lastRun: run && {
      finishedAt: run.finishedAt.toISOString(),
      cause: run.cause,
      changed: run.changed,
      changes: (run.changes as MatchChange[]).slice(0, 50).map((change) => ({
        frameId: change.frameId,
        fileName: input.changedNames.get(change.frameId)?.split('/').pop() ?? null,
        from: change.fromPersonId ? (names.get(change.fromPersonId) ?? null) : null,
        to: change.toPersonId ? (names.get(change.toPersonId) ?? null) : null,
        pinned: decided.has(change.frameId),
      })),
      cameraOffsets: Object.entries(run.cameraOffsets as Record<string, number>).map(
        ([camera, offset]) => ({
          camera: camera.startsWith('station:') ? 'Camera without a serial' : camera,
          offsetMinutes: Math.round(offset / 60_000),
        }),
      ),
      typedFrameMismatches: (
        run.typedFrameMismatches as Array<{ sittingId: string; typed: number; slateFrame: number }>
      ).map((mismatch) => ({
        sitterName:
          names.get(personOfSitting.get(mismatch.sittingId) ?? '') ?? 'A sitting since undone',
        typed: mismatch.typed,
        slateFrame: mismatch.slateFrame,
      })),
    },
    matching: input.matching,
    sitters,
    notPhotographed: input.notPhotographed,
    frames,
    lastChange: input.lastChange && {
      changeId: input.lastChange.changeId,
      action: input.lastChange.action,
      frames: Number(input.lastChange.frames),
    },
  };
}
