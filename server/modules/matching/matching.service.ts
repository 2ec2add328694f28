import { randomUUID } from 'node:crypto';
import type { Db } from '../../db/database';
import type { MatchChange } from '../../db/match-types';
import { AppError } from '../../lib/errors';
import type { Viewer } from '../../lib/viewer';
import type { DayReview, MatchDecisionRequest } from '../../schemas/matching';
import { lockDay } from '../days/days.repository';
import { findStudioDay } from '../days/studio-day-access';
import { buildReview } from './review-model';
import * as matches from './matching.repository';
import { queueDayMatch } from './matching-tasks';
import * as repo from './review.repository';

export type MatchingService = ReturnType<typeof createMatchingService>;

/** The review screen's side of matching: what each frame is, and people's changes to it. */
export function createMatchingService(deps: { db: Db }) {
  const { db } = deps;

  async function review(viewer: Viewer, dayId: string): Promise<DayReview> {
    const day = await findStudioDay(db, viewer, dayId);
    const [frames, sittings, notPhotographed, lastRun, queued, lastChange] = await Promise.all([
      repo.effectiveFrames(db, day.id),
      repo.daySittings(db, day.id),
      repo.bookedNotPhotographed(db, day.id),
      matches.latestRun(db, day.id),
      matches.matchQueued(db, day.id),
      repo.latestChange(db, day.id, viewer.id),
    ]);
    const decidedPeople = [
      ...new Set(frames.flatMap((frame) => (frame.decidedPersonId ? [frame.decidedPersonId] : []))),
    ].filter((personId) => !sittings.some((sitting) => sitting.personId === personId));
    const changes = (lastRun?.changes ?? []) as MatchChange[];
    const [extraPeople, changedNames, changedPeople] = await Promise.all([
      repo.peopleByIds(db, decidedPeople),
      repo.cardNames(
        db,
        changes.slice(0, 50).map((change) => change.frameId),
      ),
      repo.peopleByIds(db, [
        ...new Set(
          changes
            .slice(0, 50)
            .flatMap((change) => [change.fromPersonId, change.toPersonId])
            .filter((id): id is string => id !== null),
        ),
      ]),
    ]);
    return buildReview({
      day,
      frames,
      sittings,
      extraPeople,
      notPhotographed,
      lastRun: lastRun ?? null,
      changedNames,
      changedPeople,
      matching: queued,
      lastChange: lastChange ?? null,
    });
  }

  return {
    review,

    /** Queues a match of the day now; the screen shows it running until it is done. */
    async requestRun(viewer: Viewer, dayId: string) {
      const day = await findStudioDay(db, viewer, dayId);
      await queueDayMatch(db, day.id, 'on_demand', viewer.id);
      return { queued: true };
    },

    /**
     * Records one change of people's minds. Every frame must be the day's; a person given
     * frames must belong to the day's client. All frames change, or none.
     */
    async decide(viewer: Viewer, dayId: string, request: MatchDecisionRequest) {
      const day = await findStudioDay(db, viewer, dayId);
      const known = await repo.framesOfDay(db, day.id, request.frameIds);
      const strangers = request.frameIds.filter((id) => !known.has(id));
      if (strangers.length > 0) {
        throw new AppError(
          'invalid_input',
          400,
          strangers.length === 1
            ? 'One of those frames is not part of this shoot day.'
            : `${strangers.length} of those frames are not part of this shoot day.`,
          { fieldErrors: { frameIds: ['Choose frames of this day.'] } },
        );
      }
      let sittingId: string | null = null;
      if (request.personId) {
        const [person] = await repo.peopleByIds(db, [request.personId]);
        if (!person || person.clientId !== day.clientId) {
          throw new AppError('invalid_input', 400, 'That person is not on this client’s roster.', {
            fieldErrors: { personId: ['Choose someone from this client’s roster.'] },
          });
        }
        const sittings = await repo.daySittings(db, day.id);
        // A moved frame joins the person's sitting; a split opens one of its own (none yet).
        const own = sittings.filter((sitting) => sitting.personId === person.id);
        sittingId = request.action === 'move' ? (own[own.length - 1]?.id ?? null) : null;
        if (request.action === 'move' && !sittingId) {
          throw new AppError(
            'invalid_input',
            400,
            `${person.name} was not photographed today: split the frames off to give them to someone new.`,
            { fieldErrors: { personId: ['Choose a sitter photographed this day.'] } },
          );
        }
      }
      const changeId = randomUUID();
      return db.transaction().execute(async (trx) => {
        // Under the day's lock, so a double click finds the first click's change and stops.
        await lockDay(trx, day.id);
        const standing = await repo.standingDecisions(trx, day.id, request.frameIds);
        const repeated = request.frameIds.map((frameId) => standing.get(frameId));
        const same = repeated.every(
          (decision) =>
            decision &&
            decision.action === request.action &&
            decision.personId === (request.personId ?? null) &&
            decision.sittingId === sittingId,
        );
        if (same && repeated[0]) {
          return {
            changeId: repeated[0].changeId,
            frames: request.frameIds.length,
            repeated: true,
          };
        }
        await repo.insertDecisions(
          trx,
          request.frameIds.map((frameId) => ({
            id: randomUUID(),
            dayId: day.id,
            changeId,
            frameId,
            action: request.action,
            personId: request.personId ?? null,
            sittingId,
            decidedByUserId: viewer.id,
          })),
        );
        return { changeId, frames: request.frameIds.length, repeated: false };
      });
    },

    /** Takes back the day's latest change; an older decision on the same frames shows again. */
    async undoLast(viewer: Viewer, dayId: string) {
      const day = await findStudioDay(db, viewer, dayId);
      // Your own latest change: undoing a colleague's from another tablet would surprise both.
      const change = await repo.latestChange(db, day.id, viewer.id);
      if (!change) throw new AppError('nothing_to_undo', 409, 'You have no change to undo.');
      const frames = await db
        .transaction()
        .execute((trx) => repo.undoChange(trx, day.id, change.changeId));
      return { changeId: change.changeId, frames };
    },
  };
}
