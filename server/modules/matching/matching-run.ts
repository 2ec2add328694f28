import { randomUUID } from 'node:crypto';
import type { Db } from '../../db/database';
import type { MatchCause, MatchChange } from '../../db/match-types';
import type { Logger } from '../../lib/logger';
import { findDay } from '../days/days.repository';
import { offsetMinutesAt, zonedTimeToInstant } from '../days/zoned-time';
import { matchFrames, type FrameMatch } from './match-frames';
import * as repo from './matching.repository';

export const MATCH_DAY_TASK = 'match_day';
/** How many changed frames a run keeps for display; the full count is kept beside them. */
const KEPT_CHANGES = 300;

export interface MatchRunSummary {
  runId: string;
  frames: number;
  matched: number;
  conflicts: number;
  leftovers: number;
  changed: number;
}

/**
 * Runs the matcher over a day and stores what the evidence says, one run at a time per day.
 * People's decisions are read and passed in, but stored apart: a run never changes them.
 */
export function createMatchRunner(deps: { db: Db; logger: Logger }) {
  const { db, logger } = deps;

  return async function runDayMatch(
    dayId: string,
    cause: MatchCause,
    requestedByUserId: string | null = null,
  ): Promise<MatchRunSummary | null> {
    const day = await findDay(db, dayId);
    if (!day) return null; // the day was deleted while the job waited
    // Cameras are usually set to the office's wall clock: the fallback for a camera with no
    // slate and no typed frame number.
    const opening = zonedTimeToInstant(day.date, day.opensAt, day.timeZone);
    const assumedCameraOffset = offsetMinutesAt(opening, day.timeZone) * 60_000;

    return db.transaction().execute(async (trx) => {
      await repo.lockDayForMatching(trx, dayId);
      const [frames, sittings, manual, previous] = await Promise.all([
        repo.framesToMatch(trx, dayId),
        repo.sittingsToMatch(trx, dayId),
        repo.activeDecisions(trx, dayId),
        repo.previousMatches(trx, dayId),
      ]);
      const result = matchFrames({ frames, sittings, manual, assumedCameraOffset });
      const automatic = result.matches.map((match) => toAutomatic(match.automatic ?? match));
      const changes: MatchChange[] = [];
      for (const match of automatic) {
        const before = previous.get(match.frameId);
        if (before && (before.personId !== match.personId || before.reason !== match.reason)) {
          changes.push({
            frameId: match.frameId,
            fromPersonId: before.personId,
            toPersonId: match.personId,
            fromReason: before.reason,
            toReason: match.reason,
          });
        }
      }
      const counts = {
        frames: result.matches.length,
        matched: result.matches.filter((match) => match.personId !== null).length,
        conflicts: result.conflicts.length,
        leftovers: result.leftovers.length,
      };
      const runId = randomUUID();
      await repo.replaceMatches(
        trx,
        {
          id: runId,
          dayId,
          cause,
          requestedByUserId,
          counts,
          changed: changes.length,
          changes: changes.slice(0, KEPT_CHANGES),
          cameraOffsets: result.cameraOffsets,
          typedFrameMismatches: result.typedFrameMismatches,
        },
        automatic,
      );
      logger.info({ dayId, cause, ...counts, changed: changes.length }, 'day matched');
      return { runId, ...counts, changed: changes.length };
    });
  };
}

function toAutomatic(match: FrameMatch): repo.AutomaticMatch {
  if (match.reason === 'manual' || match.reason === 'manual_test_frame') {
    throw new Error('a manual decision has no automatic reason'); // matchFrames keeps `automatic`
  }
  return {
    frameId: match.frameId,
    sittingId: match.sittingId,
    personId: match.personId,
    reason: match.reason,
    confidence: match.confidence,
    candidates: match.candidates ?? [],
  };
}
