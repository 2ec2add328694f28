import { createHash } from 'node:crypto';
import { buffer } from 'node:stream/consumers';
import sharp from 'sharp';
import type { ObjectStorage } from '../../adapters/storage/storage';
import type { Db } from '../../db/database';
import { addJob, addJobs, type JobHandlers } from '../../jobs/job-queue';
import { recordAudit } from '../../lib/audit';
import { AppError, notFound } from '../../lib/errors';
import type { Logger } from '../../lib/logger';
import type { Viewer } from '../../lib/viewer';
import { lookSchema } from '../../schemas/looks';
import { findStudioDay } from '../days/studio-day-access';
import { planCrop } from './crop-geometry';
import type { EyeFinder } from './eye-finder';
import { findLook } from './looks.repository';
import * as repo from './portraits.repository';
import { renderRendition } from './render-rendition';

export const DETECT_EYES_TASK = 'detect_eyes';
export const RENDER_PORTRAIT_TASK = 'render_portrait';

export type PortraitsService = ReturnType<typeof createPortraitsService>;

/**
 * From picks to renditions: find the eyes in each pick's image (its final, else its original),
 * let a person mark them where detection is unsure, and render every rendition of the look.
 */
export function createPortraitsService(deps: {
  db: Db;
  storage: ObjectStorage;
  logger: Logger;
  studioName: string;
  eyeFinder: () => EyeFinder;
}) {
  const { db, storage } = deps;

  async function pickFor(viewer: Viewer, pickId: string) {
    const pick = await repo.pickSource(db, pickId);
    if (!pick) throw notFound('That pick');
    await findStudioDay(db, viewer, pick.dayId);
    return pick;
  }

  async function detect(pickId: string) {
    const pick = await repo.pickSource(db, pickId);
    if (!pick) return;
    const known = await repo.eyesOf(db, pickId);
    // A person's marks on this same image win; a new final is looked at afresh.
    if (!known || known.sourceKey !== pick.sourceKey) {
      const finding = await deps.eyeFinder().find(await buffer(await storage.read(pick.sourceKey)));
      // Marks put down by hand on the original still fit a final of the same size (a retouch
      // keeps the framing) when the finder cannot see the eyes on it either.
      const keepMarks =
        finding.status !== 'found' &&
        known?.status === 'marked' &&
        known.imageWidth === finding.width &&
        known.imageHeight === finding.height &&
        known.leftX !== null &&
        known.leftY !== null &&
        known.rightX !== null &&
        known.rightY !== null;
      await repo.saveEyes(
        db,
        keepMarks
          ? {
              pickId,
              sourceKey: pick.sourceKey,
              status: 'marked',
              left: { x: known.leftX!, y: known.leftY! },
              right: { x: known.rightX!, y: known.rightY! },
              rollDeg: known.rollDeg,
              confidence: 1,
              imageWidth: finding.width,
              imageHeight: finding.height,
              markedByUserId: known.markedByUserId,
            }
          : {
              pickId,
              sourceKey: pick.sourceKey,
              status: finding.status,
              left: finding.status === 'found' ? finding.leftEye : null,
              right: finding.status === 'found' ? finding.rightEye : null,
              rollDeg: finding.rollDeg,
              confidence: finding.confidence,
              imageWidth: finding.width,
              imageHeight: finding.height,
              markedByUserId: null,
            },
      );
    }
    await addJob(db, RENDER_PORTRAIT_TASK, { pickId }, { jobKey: `render:${pickId}` });
  }

  async function render(pickId: string) {
    const pick = await repo.pickSource(db, pickId);
    const eyes = pick ? await repo.eyesOf(db, pickId) : undefined;
    const look = pick ? await findLook(db, pick.clientId) : undefined;
    if (!pick || !eyes || !look || eyes.sourceKey !== pick.sourceKey) return;
    if (
      eyes.leftX === null ||
      eyes.leftY === null ||
      eyes.rightX === null ||
      eyes.rightY === null
    ) {
      return; // on the "needs a hand" list until someone marks the eyes
    }
    const { renditions } = lookSchema.parse({ name: look.name, renditions: look.renditions });
    const source = await buffer(await storage.read(pick.sourceKey));
    const year = new Date().getUTCFullYear();
    for (const rendition of renditions) {
      const plan = planCrop({
        imageWidth: eyes.imageWidth,
        imageHeight: eyes.imageHeight,
        leftEye: { x: eyes.leftX, y: eyes.leftY },
        rightEye: { x: eyes.rightX, y: eyes.rightY },
        rendition,
      });
      const base = {
        pickId,
        renditionName: rendition.name,
        sourceKey: pick.sourceKey,
        lookVersion: look.version,
      };
      if (!plan.ok) {
        await repo.saveRendition(db, {
          ...base,
          status: 'refused',
          refusal: plan.message,
          key: null,
          byteSize: null,
          sha256: null,
          width: null,
          height: null,
        });
        continue;
      }
      const output = await renderRendition({
        input: source,
        plan,
        rendition,
        metadata: { copyright: `© ${year} ${deps.studioName}`, credit: deps.studioName },
      });
      const key = `renditions/${pick.dayId}/${pickId}/${createHash('sha256').update(rendition.name).digest('hex').slice(0, 16)}.jpg`;
      await storage.put(key, output, { contentType: 'image/jpeg' });
      await repo.saveRendition(db, {
        ...base,
        status: 'rendered',
        refusal: null,
        key,
        byteSize: output.length,
        sha256: createHash('sha256').update(output).digest('hex'),
        width: plan.outputWidth,
        height: plan.outputHeight,
      });
    }
  }

  return {
    /** Finds the eyes in (and renders) every pick of the day: one job per pick. */
    async prepareDay(viewer: Viewer, dayId: string) {
      const day = await findStudioDay(db, viewer, dayId);
      if (!(await findLook(db, day.clientId))) {
        throw new AppError('no_look', 409, 'Set up the client’s look first.');
      }
      const picks = await repo.picksOfDay(db, day.id);
      await addJobs(
        db,
        DETECT_EYES_TASK,
        picks.map((pickId) => ({ payload: { pickId }, jobKey: `eyes:${pickId}` })),
      );
      return { queued: picks.length };
    },

    /** A person's eye marks, in the source image's upright pixels; they win over detection. */
    async markEyes(
      viewer: Viewer,
      pickId: string,
      marks: { leftEye: { x: number; y: number }; rightEye: { x: number; y: number } },
    ) {
      const pick = await pickFor(viewer, pickId);
      const meta = await sharp(await buffer(await storage.read(pick.sourceKey))).metadata();
      const upright = (meta.orientation ?? 1) >= 5;
      const width = (upright ? meta.height : meta.width) ?? 0;
      const height = (upright ? meta.width : meta.height) ?? 0;
      const [left, right] = [marks.leftEye, marks.rightEye].sort((a, b) => a.x - b.x) as [
        { x: number; y: number },
        { x: number; y: number },
      ];
      for (const point of [left, right]) {
        if (point.x < 0 || point.y < 0 || point.x > width || point.y > height) {
          throw new AppError('invalid_input', 400, 'Both eye marks must be inside the picture.');
        }
      }
      if (Math.hypot(right.x - left.x, right.y - left.y) < 8) {
        throw new AppError('invalid_input', 400, 'The two eye marks are on top of each other.');
      }
      await db.transaction().execute(async (trx) => {
        await repo.saveEyes(trx, {
          pickId: pick.id,
          sourceKey: pick.sourceKey,
          status: 'marked',
          left,
          right,
          rollDeg: (Math.atan2(right.y - left.y, right.x - left.x) * 180) / Math.PI,
          confidence: 1,
          imageWidth: width,
          imageHeight: height,
          markedByUserId: viewer.id,
        });
        await addJob(
          trx,
          RENDER_PORTRAIT_TASK,
          { pickId: pick.id },
          { jobKey: `render:${pick.id}` },
        );
        await recordAudit(trx, {
          actorUserId: viewer.id,
          action: 'looks.eyes_marked',
          subjectType: 'pick',
          subjectId: pick.id,
        });
      });
      return { pickId: pick.id, width, height };
    },

    /** A downscaled upright copy of the pick's source, to mark the eyes on. */
    async sourcePreview(viewer: Viewer, pickId: string) {
      const pick = await pickFor(viewer, pickId);
      const image = sharp(await buffer(await storage.read(pick.sourceKey))).rotate();
      return image
        .resize({ width: 1024, height: 1024, fit: 'inside', withoutEnlargement: true })
        .jpeg({ quality: 80 })
        .toBuffer();
    },

    async openRendition(viewer: Viewer, pickId: string, renditionName: string) {
      await pickFor(viewer, pickId);
      const file = await repo.renditionFile(db, pickId, renditionName);
      if (!file?.key) throw notFound('That rendition');
      return { stream: await storage.read(file.key), size: Number(file.byteSize ?? 0) };
    },

    handlers(): JobHandlers {
      const pickOf = (payload: unknown) => (payload as { pickId?: unknown }).pickId;
      return {
        [DETECT_EYES_TASK]: async (payload) => {
          const pickId = pickOf(payload);
          if (typeof pickId === 'string') await detect(pickId);
        },
        [RENDER_PORTRAIT_TASK]: async (payload) => {
          const pickId = pickOf(payload);
          if (typeof pickId === 'string') await render(pickId);
        },
      };
    },
  };
}
