import { randomUUID } from 'node:crypto';
import type { Writable } from 'node:stream';
import type { ObjectStorage } from '../../adapters/storage/storage';
import type { Db } from '../../db/database';
import { recordAudit } from '../../lib/audit';
import { AppError, notFound } from '../../lib/errors';
import type { Viewer } from '../../lib/viewer';
import { controlCharacterPattern } from '../../schemas/common';
import type { FinalUploadMetadata, FrameUploadResult } from '../../schemas/frames';
import type { RetouchPage, RetouchQuery } from '../../schemas/proofs';
import { findStudioDay } from '../days/studio-day-access';
import { screenUploadedFile } from '../frames/frame-screening';
import { refuseUpload, type FinalUploads } from '../frames/frames.service';
import * as frames from '../frames/frames.repository';
import * as proofs from '../proofs/proofs.repository';
import { streamZip } from '../delivery/set-zip';
import * as repo from './retouch.repository';

export type RetouchService = ReturnType<typeof createRetouchService>;

/** A name safe as a folder inside a ZIP on any system. */
const safeName = (text: string) =>
  text
    .replace(new RegExp(controlCharacterPattern.source, 'g'), '')
    .replace(/[\\/:*?"<>|]/g, '')
    .trim() || 'sitter';

/** The studio's side after the picks: the queue, the originals, the finals coming back. */
export function createRetouchService(deps: { db: Db; storage: ObjectStorage; maxPixels: number }) {
  const { db, storage } = deps;

  async function pickFor(viewer: Viewer, pickId: string) {
    const pick = await repo.findPick(db, pickId);
    if (!pick) throw notFound('That pick');
    await findStudioDay(db, viewer, pick.dayId);
    return pick;
  }

  const finals: FinalUploads = {
    async check(viewer: Viewer, metadata: FinalUploadMetadata) {
      const pick = await pickFor(viewer, metadata.pickId);
      if (pick.dayId !== metadata.dayId) throw notFound('That pick');
    },

    /** Screens a final like a frame (an image by its bytes, within the pixel limit). */
    async finish(upload, filePath): Promise<FrameUploadResult> {
      const pick = upload.pickId ? await repo.findPick(db, upload.pickId) : undefined;
      if (!pick) throw notFound('That pick');
      const screening = await screenUploadedFile(filePath, upload.cardPath, deps.maxPixels);
      if (!screening.ok) {
        const message =
          screening.code === 'not_a_frame'
            ? `“${upload.cardPath}” is not an image Likeness can deliver: send the final as JPEG, TIFF or HEIF.`
            : screening.message;
        return refuseUpload(db, upload.id, screening.code, message);
      }
      const extension = upload.cardPath.split('.').pop()?.toLowerCase() ?? 'jpg';
      const key = `finals/${pick.dayId}/${pick.id}/${randomUUID()}.${extension.replace(/[^a-z0-9]/g, '') || 'jpg'}`;
      const stored = await storage.putFile(key, filePath, { contentType: screening.contentType });
      try {
        await db.transaction().execute(async (trx) => {
          await repo.saveFinal(trx, pick.id, {
            key,
            fileName: upload.cardPath.split('/').pop() ?? upload.cardPath,
            byteSize: stored.size,
            userId: upload.userId,
          });
          await frames.closeUpload(trx, upload.id, { status: 'stored', frameId: pick.frameId });
          await recordAudit(trx, {
            actorUserId: upload.userId,
            action: 'retouch.final_uploaded',
            subjectType: 'pick',
            subjectId: pick.id,
            details: { replaced: pick.finalKey !== null },
          });
        });
      } catch (error) {
        await storage.delete(key);
        throw error;
      }
      // An earlier final for the same pick is replaced; the original frame is never touched.
      if (pick.finalKey) await storage.delete(pick.finalKey).catch(() => undefined);
      return { outcome: 'stored', frameId: pick.frameId };
    },
  };

  return {
    finals,

    async queue(viewer: Viewer, dayId: string, query: RetouchQuery): Promise<RetouchPage> {
      const day = await findStudioDay(db, viewer, dayId);
      const [page, counts, dayProofs] = await Promise.all([
        repo.retouchPage(db, day.id, viewer.id, query),
        repo.statusCounts(db, day.id, query),
        proofs.dayProofs(db, day.id),
      ]);
      return {
        ...page,
        page: query.page,
        pageSize: query.pageSize,
        counts,
        picksCloseAt: dayProofs?.picksCloseAt.toISOString() ?? null,
      };
    },

    async update(
      viewer: Viewer,
      pickId: string,
      change: {
        status?: 'to_do' | 'in_progress' | 'done' | undefined;
        takenByMe?: boolean | undefined;
      },
    ) {
      const pick = await pickFor(viewer, pickId);
      if (change.status === 'done' && !pick.finalKey) {
        throw new AppError(
          'no_final',
          409,
          'Upload the retouched file first: it marks the pick done.',
        );
      }
      const next = await db.transaction().execute(async (trx) => {
        // Who has the pick, read under the row's lock, so two takes cannot cross: taking or
        // letting go a pick someone else took since this page loaded would silently move
        // their work, so say who has it instead.
        const holder = await repo.pickHolderForUpdate(trx, pick.id);
        const heldByOther = holder?.retouchUserId && holder.retouchUserId !== viewer.id;
        if (change.takenByMe !== undefined && heldByOther) {
          throw new AppError(
            'pick_taken',
            409,
            `${holder.displayName ?? 'Someone'} has taken this pick since the list was loaded. Ask them to let it go first.`,
          );
        }
        const written = {
          ...(change.status ? { retouchStatus: change.status } : {}),
          ...(change.takenByMe === undefined
            ? change.status === 'in_progress' && !holder?.retouchUserId
              ? { retouchUserId: viewer.id }
              : {}
            : { retouchUserId: change.takenByMe ? viewer.id : null }),
        };
        await repo.updatePick(trx, pick.id, written);
        await recordAudit(trx, {
          actorUserId: viewer.id,
          action: 'retouch.pick_updated',
          subjectType: 'pick',
          subjectId: pick.id,
          details: { ...change },
        });
        return written;
      });
      return { pickId: pick.id, ...next };
    },

    /** Streams every pick's original as one ZIP, one file at a time (the delivery's writer). */
    async writeOriginalsZip(viewer: Viewer, dayId: string, out: Writable) {
      const day = await findStudioDay(db, viewer, dayId);
      const picks = await repo.picksWithOriginals(db, day.id);
      if (picks.length === 0) throw new AppError('no_picks', 409, 'Nobody has picked yet.');
      const used = new Set<string>();
      const files = picks.map((pick) => {
        const folder = safeName(
          [pick.familyName, pick.givenName, pick.employeeId].filter(Boolean).join(' '),
        );
        let name = `${folder}/${safeName(pick.cardPath.split('/').pop() ?? 'frame')}`;
        if (used.has(name)) name = name.replace(/(\.[^.]*)?$/, `-${pick.id.slice(0, 8)}$1`);
        used.add(name);
        return { name, open: () => storage.read(pick.originalKey) };
      });
      await streamZip(out, [], files);
      return `${day.clientName} ${day.date} picks.zip`;
    },

    async openFinal(viewer: Viewer, pickId: string) {
      const pick = await pickFor(viewer, pickId);
      if (!pick.finalKey || !pick.finalFileName) throw notFound('That final');
      const stat = await storage.stat(pick.finalKey);
      if (!stat) throw notFound('That final');
      return {
        stream: await storage.read(pick.finalKey),
        size: stat.size,
        fileName: pick.finalFileName,
      };
    },
  };
}
