import { randomUUID } from 'node:crypto';
import type { Readable } from 'node:stream';
import type { ObjectStorage } from '../../adapters/storage/storage';
import type { Db } from '../../db/database';
import { addJob } from '../../jobs/job-queue';
import { AppError, forbidden, notFound } from '../../lib/errors';
import { toCsv } from '../../lib/csv';
import { parseInput } from '../../lib/validate';
import type { Viewer } from '../../lib/viewer';
import {
  finalUploadMetadataSchema,
  frameUploadMetadataSchema,
  type FinalUploadMetadata,
  type DayFramesOverview,
  type FrameListQuery,
  type FramePage,
  type FrameUploadResult,
  type KnownFramesRequest,
} from '../../schemas/frames';
import type { DayFrameCounts } from '../../schemas/matching';
import { findFollowedDay, findStudioDay } from '../days/studio-day-access';
import { frameCounts } from '../matching/review-model';
import { effectiveFrames } from '../matching/review.repository';
import { frameCsvHeader, frameCsvRow } from './frame-csv';
import { parseDcfPath } from './reading/dcf-path';
import { screenUploadedFile, sha256OfFile } from './frame-screening';
import * as repo from './frames.repository';

export const INGEST_FRAME_TASK = 'ingest_frame';

export interface UploadLimits {
  maxBytes: number;
  maxPixels: number;
}

export type FramesService = ReturnType<typeof createFramesService>;

/** Frames belong to the studio: its admin, and the photographers working that day. */
/** Retouched finals come back through the same resumable upload; their rules live elsewhere. */
export interface FinalUploads {
  /** Checks a final before its first byte is accepted: the day and pick it is for. */
  check(viewer: Viewer, metadata: FinalUploadMetadata): Promise<void>;
  /** The last byte has arrived: screen and store the final beside its pick's original. */
  finish(upload: repo.UploadRecord, filePath: string): Promise<FrameUploadResult>;
}

export function createFramesService(deps: {
  db: Db;
  storage: ObjectStorage;
  limits: UploadLimits;
  finals?: FinalUploads;
}) {
  const { db, storage, limits } = deps;

  const dayFor = (viewer: Viewer, dayId: string) => findStudioDay(db, viewer, dayId);

  async function uploadOf(viewer: Viewer, uploadId: string) {
    const upload = await repo.findUpload(db, uploadId);
    // Someone else's upload is answered as if it did not exist: ids are not to be probed.
    if (!upload || (upload.userId !== viewer.id && viewer.role !== 'studio_admin')) {
      throw notFound('That upload');
    }
    return upload;
  }

  return {
    dayFor,

    /** Checks a new tus upload before its first byte is accepted, and records who started it. */
    async startUpload(
      viewer: Viewer,
      input: { metadata: Record<string, string | null>; declaredSize: number | null },
    ): Promise<string> {
      const final = input.metadata.purpose === 'final';
      const metadata = final
        ? parseInput(finalUploadMetadataSchema, input.metadata)
        : parseInput(frameUploadMetadataSchema, input.metadata);
      const day = await dayFor(viewer, metadata.dayId);
      if ('pickId' in metadata) {
        if (!deps.finals) throw new AppError('invalid_input', 400, 'Finals cannot be sent here.');
        await deps.finals.check(viewer, metadata);
      } else if (!day.stations.some((station) => station.id === metadata.stationId)) {
        throw new AppError('invalid_input', 400, 'That station is not part of this shoot day.');
      }
      const size = input.declaredSize;
      if (size === null || !Number.isSafeInteger(size) || size <= 0) {
        throw new AppError('invalid_input', 400, 'Say how large the file is before sending it.');
      }
      if (size > limits.maxBytes) {
        throw new AppError(
          'file_too_large',
          413,
          `“${metadata.cardPath}” is ${formatMegabytes(size)}, over the ${formatMegabytes(limits.maxBytes)} limit for one file.`,
        );
      }
      const id = randomUUID().replace(/-/g, '');
      await repo.insertUpload(db, {
        id,
        dayId: day.id,
        stationId: 'stationId' in metadata ? metadata.stationId : null,
        purpose: 'pickId' in metadata ? 'final' : 'frame',
        pickId: 'pickId' in metadata ? metadata.pickId : null,
        userId: viewer.id,
        cardPath: metadata.cardPath,
        declaredSize: size,
        declaredSha256: metadata.sha256 ?? null,
      });
      return id;
    },

    /** A resumed or cancelled upload belongs to the person who started it (or the studio admin). */
    async checkUploadAccess(viewer: Viewer, uploadId: string): Promise<void> {
      const upload = await uploadOf(viewer, uploadId);
      if (upload.status !== 'receiving') {
        throw new AppError('upload_closed', 410, 'That upload has already finished.');
      }
    },

    /**
     * The last byte has arrived: screen the file, store it as an original (never changed after),
     * write its frame row and queue its reading, all or nothing. A duplicate stores nothing.
     */
    async finishUpload(uploadId: string, filePath: string): Promise<FrameUploadResult> {
      const upload = await repo.findUpload(db, uploadId);
      if (!upload) throw notFound('That upload');
      if (upload.purpose === 'final') {
        if (!deps.finals) throw notFound('That upload');
        return deps.finals.finish(upload, filePath);
      }
      const stationId = upload.stationId;
      if (!stationId) throw notFound('That upload');
      const sha256 = await sha256OfFile(filePath);
      if (upload.declaredSha256 && upload.declaredSha256 !== sha256) {
        return refuse(
          upload.id,
          'changed_in_transit',
          'The file changed on the way: send it again.',
        );
      }
      const existing = await repo.findFrameByContent(db, upload.dayId, sha256);
      if (existing) {
        await repo.closeUpload(db, upload.id, { status: 'duplicate', frameId: existing });
        return { outcome: 'duplicate', frameId: existing };
      }
      const screening = await screenUploadedFile(filePath, upload.cardPath, limits.maxPixels);
      if (!screening.ok) return refuse(upload.id, screening.code, screening.message);

      const frameId = randomUUID();
      const dcf = parseDcfPath(upload.cardPath);
      const originalKey = `originals/${upload.dayId}/${frameId}${dcf.extension ? `.${dcf.extension.toLowerCase()}` : ''}`;
      const stored = await storage.putFile(originalKey, filePath, {
        contentType: screening.contentType,
      });
      const frame: repo.NewFrame = {
        id: frameId,
        dayId: upload.dayId,
        stationId,
        uploadedByUserId: upload.userId,
        cardPath: upload.cardPath,
        contentSha256: sha256,
        byteSize: stored.size,
        format: screening.format,
        originalKey,
        dcfFolder: dcf.folderNumber,
        dcfNumber: dcf.fileNumber,
        dcfStem: dcf.fileNumber === null ? null : dcf.stem,
      };
      try {
        const inserted = await db.transaction().execute(async (trx) => {
          if (!(await repo.insertFrame(trx, frame))) return false;
          await repo.pairWithPartner(trx, frame);
          await addJob(trx, INGEST_FRAME_TASK, { frameId }, { jobKey: `ingest:${frameId}` });
          await repo.closeUpload(trx, upload.id, { status: 'stored', frameId });
          return true;
        });
        if (!inserted) {
          // The same file finished twice at once: the other upload's row stands.
          await storage.delete(originalKey);
          const twin = await repo.findFrameByContent(db, upload.dayId, sha256);
          await repo.closeUpload(db, upload.id, { status: 'duplicate', frameId: twin });
          return { outcome: 'duplicate', frameId: twin ?? frameId };
        }
      } catch (error) {
        await storage.delete(originalKey);
        throw error;
      }
      return { outcome: 'stored', frameId };
    },

    async knownFiles(viewer: Viewer, dayId: string, request: KnownFramesRequest) {
      const day = await dayFor(viewer, dayId);
      return { known: await repo.knownFiles(db, day.id, request.files) };
    },

    async overview(viewer: Viewer, dayId: string): Promise<DayFramesOverview> {
      const day = await dayFor(viewer, dayId);
      const [stations, refusedUploads] = await Promise.all([
        repo.stationProgress(db, day.id),
        repo.recentRefusals(db, day.id),
      ]);
      return {
        dayId: day.id,
        dayDate: day.date,
        clientName: day.clientName,
        officeName: day.officeName,
        maxUploadBytes: limits.maxBytes,
        stations,
        refusedUploads,
      };
    },

    /** The day's frames with their sitters; a coordinator of the client sees counts only. */
    async list(
      viewer: Viewer,
      dayId: string,
      query: FrameListQuery,
    ): Promise<FramePage | DayFrameCounts> {
      if (viewer.role === 'coordinator') {
        const day = await findFollowedDay(db, viewer, dayId);
        return { dayId: day.id, counts: frameCounts(await effectiveFrames(db, day.id)) };
      }
      const day = await dayFor(viewer, dayId);
      const { frames, total } = await repo.listFrames(db, day.id, query);
      return { frames, total, page: query.page, pageSize: query.pageSize };
    },

    /** Every frame of the query as CSV rows (header first), for the studio's spreadsheet. */
    async exportCsv(viewer: Viewer, dayId: string, query: FrameListQuery): Promise<string> {
      if (viewer.role === 'coordinator') {
        throw forbidden('Coordinators see how many frames are matched, not the frames.');
      }
      const day = await dayFor(viewer, dayId);
      const { frames } = await repo.listFrames(db, day.id, query, false);
      return toCsv([frameCsvHeader, ...frames.map(frameCsvRow)]);
    },

    /** Streams a frame's thumbnail, preview or original after checking the viewer may see it. */
    async openFile(
      viewer: Viewer,
      frameId: string,
      which: 'thumbnail' | 'preview' | 'original',
    ): Promise<{ stream: Readable; contentType: string; fileName: string; size: number }> {
      const frame = await repo.findFrame(db, frameId);
      if (!frame) throw notFound('That frame');
      await dayFor(viewer, frame.dayId);
      const key =
        which === 'original'
          ? frame.originalKey
          : which === 'preview'
            ? frame.previewKey
            : frame.thumbnailKey;
      if (!key) throw new AppError('no_preview', 404, 'This frame has no preview.');
      const stat = await storage.stat(key);
      if (!stat) throw notFound('That file');
      const fileName = frame.cardPath.split('/').pop() ?? 'frame';
      return {
        stream: await storage.read(key),
        contentType: which === 'original' ? contentTypeOf(frame.format) : 'image/jpeg',
        fileName:
          which === 'original' ? fileName : fileName.replace(/\.[^.]+$/, '') + `-${which}.jpg`,
        size: stat.size,
      };
    },
  };

  async function refuse(uploadId: string, code: string, message: string): Promise<never> {
    return refuseUpload(db, uploadId, code, message);
  }
}

/** Records why an upload was refused and answers 422 with the same words. */
export async function refuseUpload(
  db: Db,
  uploadId: string,
  code: string,
  message: string,
): Promise<never> {
  await repo.closeUpload(db, uploadId, { status: 'refused', refusal: message });
  throw new AppError(code, 422, message);
}

function contentTypeOf(format: 'jpeg' | 'heif' | 'raw') {
  return format === 'jpeg'
    ? 'image/jpeg'
    : format === 'heif'
      ? 'image/heif'
      : 'application/octet-stream';
}

function formatMegabytes(bytes: number) {
  return `${Math.round(bytes / 1_000_000).toLocaleString('en-GB')} MB`;
}
