import { AppError } from '../../lib/errors';
import type { ConsoleAction } from '../../schemas/console';
import type { ActionContext } from './console-actions';
import * as repo from './console-actions.repository';

/** Undo is for a slip of the finger, not for rewriting the day. Measured on the tablet's own
 * clock between the two actions, so an undo queued offline replays the same way. */
export const undoWindowMs = 2 * 60_000;

export async function undoAction(
  context: ActionContext,
  target: ConsoleAction,
  targetTabletAt: Date,
): Promise<string> {
  const { trx, day, now } = context;
  if (context.tabletAt.getTime() - targetTabletAt.getTime() > undoWindowMs) {
    throw new AppError('undo_expired', 409, 'Too late to undo that change.');
  }
  switch (target.kind) {
    case 'check_in_pass':
    case 'check_in_person':
    case 'check_in_new_person': {
      const found = await repo.findCheckIn(trx, day.id, target.checkInId);
      if (!found || found.undoneAt) throw new AppError('already_undone', 409, 'Already undone.');
      const sitting = await trx
        .selectFrom('sittings')
        .select('id')
        .where('checkInId', '=', found.id)
        .where('undoneAt', 'is', null)
        .executeTakeFirst();
      if (sitting) {
        throw new AppError('has_sitting', 409, 'Undo the sitting before the check-in.');
      }
      await trx.updateTable('checkIns').set({ undoneAt: now }).where('id', '=', found.id).execute();
      return 'Check-in undone.';
    }
    case 'start_sitting': {
      const sitting = await repo.findSitting(trx, day.id, target.sittingId);
      if (!sitting || sitting.undoneAt)
        throw new AppError('already_undone', 409, 'Already undone.');
      await trx
        .updateTable('sittings')
        .set({ undoneAt: now })
        .where('id', '=', sitting.id)
        .execute();
      return 'Sitting removed.';
    }
    case 'finish_sitting': {
      const sitting = await repo.findSitting(trx, day.id, target.sittingId);
      if (!sitting || sitting.undoneAt || !sitting.finishedAt) {
        throw new AppError('already_undone', 409, 'Already undone.');
      }
      // Reopening fails on the station's one-open-sitting index if another has begun.
      await trx
        .updateTable('sittings')
        .set({
          finishedAt: null,
          tabletFinishedAt: null,
          finishedByUserId: null,
          lastFrame: null,
          typedLastFrame: null,
        })
        .where('id', '=', sitting.id)
        .execute();
      return 'Sitting reopened.';
    }
    case 'mark_no_show': {
      const result = await trx
        .updateTable('noShows')
        .set({ undoneAt: now })
        .where('id', '=', target.noShowId)
        .where('undoneAt', 'is', null)
        .executeTakeFirst();
      if (result.numUpdatedRows === 0n)
        throw new AppError('already_undone', 409, 'Already undone.');
      return 'No-show mark removed.';
    }
    case 'correct_frames':
      // The typed numbers are kept anyway; a wrong correction is put right by correcting again.
      throw new AppError(
        'cannot_undo',
        409,
        'A correction is not undone: correct the frame numbers again instead.',
      );
    case 'undo':
      throw new AppError('cannot_undo', 409, 'An undo cannot itself be undone.');
  }
}
