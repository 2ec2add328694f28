import { recordAudit } from '../../lib/audit';
import { AppError, notFound } from '../../lib/errors';
import type { ConsoleAction } from '../../schemas/console';
import { formatFrame, implausibleFrames } from '../../schemas/console-rules';
import type { ActionContext } from './console-actions';
import * as repo from './console-actions.repository';

type CorrectFrames = Extract<ConsoleAction, { kind: 'correct_frames' }>;

/**
 * Corrects a mistyped first or last frame of the sitting in the chair or the last one finished
 * at this station. The typed numbers stay on the sitting beside the corrected ones, and the
 * audit log keeps each correction's before and after.
 */
export async function correctFrames(context: ActionContext, action: CorrectFrames) {
  const { trx, day, now, viewer } = context;
  const sitting = await repo.findSitting(trx, day.id, action.sittingId);
  if (!sitting || sitting.undoneAt) throw notFound('That sitting');
  if (sitting.stationId !== action.stationId) {
    throw new AppError(
      'other_station',
      409,
      'This sitting was taken at another station. Correct it on that station’s tablet.',
    );
  }
  const correctable = await repo.findCorrectableSittingIds(trx, day.id, sitting.stationId);
  if (!correctable.includes(sitting.id)) {
    throw new AppError(
      'too_late_to_correct',
      409,
      'Only the sitting in the chair and the last one finished can be corrected at the station.',
    );
  }
  if (action.lastFrame !== undefined && !sitting.finishedAt) {
    throw new AppError(
      'sitting_open',
      409,
      'This sitting is still in the chair: enter the last frame when you finish it.',
    );
  }
  const firstFrame = action.firstFrame ?? sitting.firstFrame;
  const lastFrame = action.lastFrame ?? sitting.lastFrame;
  const changed = action.firstFrame !== undefined ? 'firstFrame' : 'lastFrame';
  if (firstFrame === sitting.firstFrame && lastFrame === sitting.lastFrame) {
    throw new AppError(
      'nothing_to_correct',
      400,
      'These are already the sitting’s frame numbers.',
      {
        fieldErrors: { [changed]: ['This is the number already recorded.'] },
      },
    );
  }
  const implausible = implausibleFrames(firstFrame, lastFrame);
  if (implausible) {
    throw new AppError('implausible_frames', 400, implausible, {
      fieldErrors: { [changed]: ['Check the camera’s frame counter.'] },
    });
  }
  await trx
    .updateTable('sittings')
    .set({
      firstFrame,
      lastFrame,
      // Rows written before typed numbers were kept: what stood there was what was typed.
      typedFirstFrame: sitting.typedFirstFrame ?? sitting.firstFrame,
      framesCorrectedAt: now,
      framesCorrectedByUserId: viewer.id,
    })
    .where('id', '=', sitting.id)
    .execute();
  await recordAudit(trx, {
    actorUserId: viewer.id,
    action: 'sitting.frames_corrected',
    subjectType: 'sitting',
    subjectId: sitting.id,
    details: {
      dayId: day.id,
      stationId: sitting.stationId,
      idempotencyKey: action.idempotencyKey,
      before: { firstFrame: sitting.firstFrame, lastFrame: sitting.lastFrame },
      after: { firstFrame, lastFrame },
    },
  });
  const parts = [
    action.firstFrame === undefined ? null : `first frame ${formatFrame(firstFrame)}`,
    action.lastFrame === undefined || lastFrame === null
      ? null
      : `last frame ${formatFrame(lastFrame)}`,
  ].filter((part) => part !== null);
  return { personId: sitting.personId, corrected: parts.join(' and ') };
}
