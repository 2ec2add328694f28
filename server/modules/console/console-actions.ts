import type { Transaction } from 'kysely';
import type { Clock } from '../../adapters/clock';
import type { Db } from '../../db/database';
import type { Database } from '../../db/types';
import { recordAudit } from '../../lib/audit';
import { AppError, notFound } from '../../lib/errors';
import type { Viewer } from '../../lib/viewer';
import {
  consoleActionSchema,
  type ConsoleAction,
  type ConsoleActionResult,
} from '../../schemas/console';
import { implausibleFrames, mayMarkNoShow, noShowAllowedFrom } from '../../schemas/console-rules';
import { correctFrames } from './console-frame-corrections';
import { undoAction } from './console-undo';
import * as repo from './console-actions.repository';
import type { DayRecord } from './console.repository';
import { explainConstraint, pgError, timeIn } from './console-errors';

type Trx = Transaction<Database>;
export interface ActionContext {
  trx: Trx;
  now: Date;
  tabletAt: Date;
  viewer: Viewer;
  day: DayRecord;
}

/**
 * Applies one console action at most once: the idempotency key is stored with the result in
 * the same transaction as the change, and NOTIFY wakes the other tablets only on commit.
 */
export async function applyConsoleAction(
  deps: { db: Db; clock: Clock },
  viewer: Viewer,
  day: DayRecord,
  action: ConsoleAction,
): Promise<ConsoleActionResult> {
  if (!day.stations.some((station) => station.id === action.stationId)) {
    throw notFound('That station');
  }
  const replay = () => replayOf(deps.db, day, action);
  const earlier = await replay();
  if (earlier) return earlier;

  const now = deps.clock.now();
  try {
    return await deps.db.transaction().execute(async (trx) => {
      // A replay sent while the first is still in flight waits here for it to commit, then is
      // answered with its stored result instead of colliding with its rows (and a 409).
      await repo.lockActionKey(trx, action.idempotencyKey);
      const stored = await replayOf(trx, day, action);
      if (stored) return stored;
      const context: ActionContext = { trx, now, tabletAt: new Date(action.tabletAt), viewer, day };
      const message = await perform(context, action);
      const result: ConsoleActionResult = {
        idempotencyKey: action.idempotencyKey,
        kind: action.kind,
        replayed: false,
        message,
      };
      await repo.insertAction(trx, {
        idempotencyKey: action.idempotencyKey,
        dayId: day.id,
        stationId: action.stationId,
        userId: viewer.id,
        kind: action.kind,
        payload: action,
        result,
        tabletAt: context.tabletAt,
        receivedAt: now,
      });
      await repo.notifyDayChanged(trx, day.id);
      return result;
    });
  } catch (error) {
    const { code, constraint } = pgError(error);
    if (code !== '23505') throw error;
    // The same key sent twice at once: the first one won, this one reports its result.
    const winner = await replay();
    if (winner) return winner;
    if (constraint?.startsWith('check_ins_one_per') && 'checkInId' in action) {
      throw await alreadyCheckedIn(deps.db, day, action);
    }
    throw explainConstraint(constraint) ?? error;
  }
}

/** The stored answer to an action already applied under this key, or null. */
async function replayOf(
  db: Db | Trx,
  day: DayRecord,
  action: ConsoleAction,
): Promise<ConsoleActionResult | null> {
  const stored = await repo.findActionByKey(db, action.idempotencyKey);
  if (!stored) return null;
  if (stored.dayId !== day.id || stored.kind !== action.kind) {
    throw new AppError('key_reused', 409, 'This change key was already used for another change.');
  }
  return { ...(stored.result as ConsoleActionResult), replayed: true };
}

async function alreadyCheckedIn(db: Db, day: DayRecord, action: ConsoleAction) {
  let personId: string | undefined;
  if ('personId' in action) personId = action.personId;
  else if (action.kind === 'check_in_pass') {
    personId = (await repo.findBookingByPassToken(db, action.passToken))?.personId;
  }
  const existing = personId ? await repo.findActiveCheckIn(db, day.id, personId) : undefined;
  if (!existing) return explainConstraint('check_ins_one_per_person_day')!;
  return new AppError(
    'already_checked_in',
    409,
    `Already checked in at ${existing.stationName}, ${timeIn(day.timeZone, existing.checkedInAt)}.`,
  );
}

async function checkIn(
  context: ActionContext,
  input: {
    checkInId: string;
    personId: string;
    bookingId: string | null;
    stationId: string;
    method: 'pass' | 'search' | 'walk_in' | 'new_person';
  },
) {
  const { trx, day } = context;
  const existing = await repo.findActiveCheckIn(trx, day.id, input.personId);
  if (existing) {
    throw new AppError(
      'already_checked_in',
      409,
      `Already checked in at ${existing.stationName}, ${timeIn(day.timeZone, existing.checkedInAt)}.`,
    );
  }
  await repo.insertCheckIn(trx, {
    id: input.checkInId,
    dayId: day.id,
    personId: input.personId,
    bookingId: input.bookingId,
    stationId: input.stationId,
    method: input.method,
    checkedInAt: context.now,
    tabletAt: context.tabletAt,
    byUserId: context.viewer.id,
  });
  // A late arrival after a no-show mark: the sitter is here after all.
  if (input.bookingId) {
    await trx
      .updateTable('noShows')
      .set({ undoneAt: context.now })
      .where('bookingId', '=', input.bookingId)
      .where('undoneAt', 'is', null)
      .execute();
  }
}

async function perform(context: ActionContext, action: ConsoleAction): Promise<string> {
  const { trx, day, now } = context;
  switch (action.kind) {
    case 'check_in_pass': {
      const booking = await repo.findBookingByPassToken(trx, action.passToken);
      if (!booking) {
        throw new AppError('unknown_pass', 404, 'This code is not a pass for any booking.');
      }
      if (booking.clientId !== day.clientId) {
        throw new AppError('other_client', 409, "This pass is for another client's day.");
      }
      if (booking.dayId !== day.id) {
        throw new AppError('other_day', 409, `This pass is for another day (${booking.date}).`);
      }
      if (booking.status === 'cancelled') {
        throw new AppError(
          'pass_cancelled',
          409,
          'This booking was cancelled. Check the sitter in by name instead.',
        );
      }
      await checkIn(context, {
        ...action,
        personId: booking.personId,
        bookingId: booking.id,
        method: 'pass',
      });
      return `${await personName(trx, booking.personId)} is checked in.`;
    }
    case 'check_in_person': {
      const person = await repo.findPerson(trx, action.personId);
      if (!person || person.clientId !== day.clientId || !person.active) {
        throw notFound("That person on this client's roster");
      }
      const booking = await repo.findActiveBookingOfPerson(trx, day.id, person.id);
      await checkIn(context, {
        ...action,
        bookingId: booking?.id ?? null,
        method: booking ? 'search' : 'walk_in',
      });
      return `${person.givenName} ${person.familyName} is checked in${booking ? '' : ' as a walk-in'}.`;
    }
    case 'check_in_new_person': {
      await repo.insertPerson(trx, {
        id: action.personId,
        clientId: day.clientId,
        officeId: day.officeId,
        givenName: action.givenName,
        familyName: action.familyName,
        email: action.email,
        addedOnDayId: day.id,
      });
      // A roster change made outside an import: the roster's own history should show it.
      await recordAudit(trx, {
        actorUserId: context.viewer.id,
        action: 'person.added_on_day',
        subjectType: 'person',
        subjectId: action.personId,
        details: { dayId: day.id, stationId: action.stationId },
      });
      await checkIn(context, { ...action, bookingId: null, method: 'new_person' });
      return `${action.givenName} ${action.familyName} joined the roster and is checked in.`;
    }
    case 'start_sitting': {
      const found = await repo.findCheckIn(trx, day.id, action.checkInId);
      if (!found || found.undoneAt) {
        throw new AppError('not_checked_in', 409, 'Check this sitter in before the sitting.');
      }
      await trx
        .insertInto('sittings')
        .values({
          id: action.sittingId,
          dayId: day.id,
          stationId: action.stationId,
          personId: found.personId,
          checkInId: found.id,
          slateToken: action.slateToken,
          firstFrame: action.firstFrame,
          typedFirstFrame: action.firstFrame,
          startedAt: now,
          tabletStartedAt: context.tabletAt,
          startedByUserId: context.viewer.id,
        })
        .execute();
      return `Sitting started for ${await personName(trx, found.personId)}.`;
    }
    case 'finish_sitting': {
      const sitting = await repo.findSitting(trx, day.id, action.sittingId);
      if (!sitting || sitting.undoneAt) throw notFound('That sitting');
      if (sitting.finishedAt) {
        throw new AppError('already_finished', 409, 'This sitting is already finished.');
      }
      const implausible = implausibleFrames(sitting.firstFrame, action.lastFrame);
      if (implausible) {
        // The tablet offers to correct the first frame when it sees this code.
        throw new AppError('implausible_last_frame', 400, implausible, {
          fieldErrors: { lastFrame: ['Check the camera’s frame counter.'] },
        });
      }
      await trx
        .updateTable('sittings')
        .set({
          finishedAt: now,
          tabletFinishedAt: context.tabletAt,
          finishedByUserId: context.viewer.id,
          lastFrame: action.lastFrame,
          typedLastFrame: action.lastFrame,
        })
        .where('id', '=', sitting.id)
        .execute();
      return `Sitting finished for ${await personName(trx, sitting.personId)}.`;
    }
    case 'correct_frames': {
      const { personId, corrected } = await correctFrames(context, action);
      return `Corrected for ${await personName(trx, personId)}: ${corrected}.`;
    }
    case 'mark_no_show': {
      const booking = await repo.findBookingOnDay(trx, day.id, action.bookingId);
      if (!booking) throw notFound('That booking');
      if (booking.status === 'cancelled') {
        throw new AppError('booking_cancelled', 409, 'This booking was cancelled.');
      }
      if (await repo.findActiveCheckIn(trx, day.id, booking.personId)) {
        throw new AppError('already_checked_in', 409, 'This sitter has checked in.');
      }
      if (!mayMarkNoShow(booking.startsAt, day.graceMinutes, now)) {
        const from = noShowAllowedFrom(booking.startsAt, day.graceMinutes);
        throw new AppError(
          'too_early',
          409,
          `Give them until ${timeIn(day.timeZone, from)} (${day.graceMinutes} minutes' grace).`,
        );
      }
      await trx
        .insertInto('noShows')
        .values({
          id: action.noShowId,
          dayId: day.id,
          bookingId: booking.id,
          stationId: action.stationId,
          markedAt: now,
          tabletAt: context.tabletAt,
          byUserId: context.viewer.id,
        })
        .execute();
      return `${await personName(trx, booking.personId)} is marked no-show.`;
    }
    case 'undo': {
      const target = await repo.findActionByKey(trx, action.targetKey);
      if (!target || target.dayId !== day.id) {
        throw notFound('The change to undo');
      }
      const parsed = consoleActionSchema.safeParse(target.payload);
      if (!parsed.success) throw new AppError('cannot_undo', 409, 'That change cannot be undone.');
      return undoAction(context, parsed.data, new Date(target.tabletAt));
    }
  }
}

export async function personName(trx: Trx, personId: string): Promise<string> {
  const person = await repo.findPerson(trx, personId);
  return person ? `${person.givenName} ${person.familyName}` : 'The sitter';
}
