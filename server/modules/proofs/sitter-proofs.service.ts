import { randomUUID } from 'node:crypto';
import { buffer } from 'node:stream/consumers';
import type { Clock } from '../../adapters/clock';
import type { ObjectStorage } from '../../adapters/storage/storage';
import type { Db } from '../../db/database';
import { recordAudit } from '../../lib/audit';
import { AppError, forbidden, notFound } from '../../lib/errors';
import type { Viewer } from '../../lib/viewer';
import type { ProofDaySummary, SavePicksRequest, SitterProofs } from '../../schemas/proofs';
import { findDay, type DayRecord } from '../days/days.repository';
import { derivedPrefix } from '../frames/frame-ingest';
import { markedProof } from './proof-mark';
import type { ProofUrls } from './proof-urls';
import * as repo from './proofs.repository';

export type SitterProofsService = ReturnType<typeof createSitterProofsService>;

/**
 * A sitter's own proofs: only their frames, only once the day is released, picks changeable
 * until the deadline. A coordinator may do the same for staff when the client allows it.
 */
export function createSitterProofsService(deps: {
  db: Db;
  clock: Clock;
  storage: ObjectStorage;
  urls: ProofUrls;
}) {
  const { db, clock, storage, urls } = deps;

  /** The day and person a viewer may choose for, or a refusal that says why. */
  async function chooserFor(viewer: Viewer, dayId: string, personId: string) {
    const day = await findDay(db, dayId);
    if (!day) throw notFound('That shoot day');
    if (viewer.role === 'sitter') {
      if (viewer.id !== personId || viewer.clientId !== day.clientId)
        throw notFound('That set of proofs');
    } else if (viewer.role === 'coordinator') {
      const settings = await repo.proofSettings(db, day.clientId);
      if (viewer.clientId !== day.clientId) throw notFound('That shoot day');
      if (!settings.hrMayChoose) {
        // A setting of the client, not a role rule: the same coordinator may once it is on.
        throw new AppError(
          'hr_choice_off',
          409,
          'Your studio has not set HR to choose portraits for staff.',
        );
      }
    } else {
      throw forbidden('Proofs are chosen by the sitter.');
    }
    const proofs = await repo.dayProofs(db, day.id);
    if (!proofs) throw notFound('That set of proofs');
    return { day, proofs };
  }

  async function proofsOf(day: DayRecord, personId: string, closeAt: Date) {
    const [frames, picks, settings] = await Promise.all([
      repo.proofFramesOf(db, day.id, personId),
      repo.picksOf(db, day.id, personId),
      repo.proofSettings(db, day.clientId),
    ]);
    if (frames.length === 0) throw notFound('That set of proofs');
    const now = clock.now().getTime();
    const result: SitterProofs = {
      dayId: day.id,
      date: day.date,
      clientName: day.clientName,
      picksCloseAt: closeAt.toISOString(),
      open: closeAt.getTime() > now,
      package: {
        included: settings.picksIncluded,
        extraAllowed: settings.extraPicksAllowed,
        extraPriceCents: settings.extraPickPriceCents,
      },
      frames: frames.map((frame, index) => ({
        id: frame.id,
        label: `Portrait ${index + 1}`,
        url: urls.urlFor(frame.id, personId, now),
        width: frame.pixelWidth,
        height: frame.pixelHeight,
      })),
      picks: picks.map((pick) => ({ frameId: pick.frameId, note: pick.note })),
      standing: picks[0]?.chosenBy === 'sitter' ? 'yours' : (picks[0]?.chosenBy ?? null),
    };
    return result;
  }

  return {
    async myDays(viewer: Viewer): Promise<ProofDaySummary[]> {
      const days = await repo.releasedDaysOf(db, viewer.id);
      const now = clock.now().getTime();
      const result: ProofDaySummary[] = [];
      for (const day of days) {
        const frames = await repo.proofFramesOf(db, day.dayId, viewer.id);
        if (frames.length === 0) continue;
        const picks = await repo.picksOf(db, day.dayId, viewer.id);
        result.push({
          dayId: day.dayId,
          date: day.date,
          clientName: day.clientName,
          picksCloseAt: day.picksCloseAt.toISOString(),
          open: day.picksCloseAt.getTime() > now,
          picked: picks.some((pick) => pick.chosenBy === 'sitter'),
        });
      }
      return result;
    },

    async proofs(viewer: Viewer, dayId: string, personId: string): Promise<SitterProofs> {
      const { day, proofs } = await chooserFor(viewer, dayId, personId);
      return proofsOf(day, personId, proofs.picksCloseAt);
    },

    /** Replaces the person's picks: all of them change, or none. */
    async savePicks(viewer: Viewer, dayId: string, personId: string, request: SavePicksRequest) {
      const { day, proofs } = await chooserFor(viewer, dayId, personId);
      if (proofs.picksCloseAt.getTime() <= clock.now().getTime()) {
        throw new AppError(
          'picks_closed',
          409,
          'The pick deadline has passed: the studio’s choice stands now.',
        );
      }
      const settings = await repo.proofSettings(db, day.clientId);
      const most = settings.picksIncluded + settings.extraPicksAllowed;
      if (request.picks.length > most) {
        throw new AppError(
          'too_many_picks',
          400,
          settings.extraPicksAllowed === 0
            ? `Your package includes ${settings.picksIncluded} portrait${settings.picksIncluded === 1 ? '' : 's'}: pick no more.`
            : `Pick at most ${most} (${settings.picksIncluded} included, ${settings.extraPicksAllowed} extra).`,
        );
      }
      const own = new Set(
        (await repo.proofFramesOf(db, day.id, personId)).map((frame) => frame.id),
      );
      if (request.picks.some((pick) => !own.has(pick.frameId))) {
        throw new AppError('invalid_input', 400, 'That frame is not one of your proofs.');
      }
      const chosenBy = viewer.role === 'coordinator' ? 'coordinator' : 'sitter';
      await db.transaction().execute(async (trx) => {
        await repo.replacePicks(trx, {
          dayId: day.id,
          personId,
          chosenBy,
          chosenByUserId: viewer.role === 'coordinator' ? viewer.id : null,
          picks: request.picks.map((pick) => ({
            id: randomUUID(),
            frameId: pick.frameId,
            note: pick.note || null,
          })),
        });
        await recordAudit(trx, {
          actorUserId: viewer.role === 'coordinator' ? viewer.id : null,
          action: 'proofs.picks_changed',
          subjectType: 'person',
          subjectId: personId,
          details: {
            dayId: day.id,
            by: chosenBy,
            frames: request.picks.map((pick) => pick.frameId),
          },
        });
      });
      return proofsOf(day, personId, proofs.picksCloseAt);
    },

    /** A proof image behind a signed URL: still that person's frame, marked, web-sized. */
    async proofImage(query: { frameId: string; personId: string; expires: number; sig: string }) {
      if (!urls.verify(query, clock.now().getTime())) {
        throw new AppError('link_expired', 403, 'This proof link has expired: reload the page.');
      }
      const frame = await db
        .selectFrom('frames')
        .where('id', '=', query.frameId)
        .select(['dayId', 'previewKey'])
        .executeTakeFirst();
      if (!frame?.previewKey) throw notFound('That proof');
      const own = await repo.proofFramesOf(db, frame.dayId, query.personId);
      if (
        !own.some((each) => each.id === query.frameId) ||
        !(await repo.dayProofs(db, frame.dayId))
      ) {
        throw notFound('That proof');
      }
      const key = `${derivedPrefix(frame.dayId, query.frameId)}proof.jpg`;
      if (!(await storage.stat(key))) {
        const preview = await buffer(await storage.read(frame.previewKey));
        await storage.put(key, await markedProof(preview), { contentType: 'image/jpeg' });
      }
      const stat = await storage.stat(key);
      return { stream: await storage.read(key), size: stat?.size ?? 0 };
    },
  };
}
