import { createWriteStream } from 'node:fs';
import { mkdtemp, rm } from 'node:fs/promises';
import os from 'node:os';
import path from 'node:path';
import { pipeline } from 'node:stream/promises';
import type { ObjectStorage } from '../../adapters/storage/storage';
import type { Db } from '../../db/database';
import type { Logger } from '../../lib/logger';
import { queueDayMatch } from '../matching/matching-tasks';
import * as repo from './frames.repository';
import { FrameReadError } from './reading/previews';
import { readFrameFile } from './reading/read-frame';

/** Where a frame's derived files live: apart from the originals, and rebuildable from them. */
export const derivedPrefix = (dayId: string, frameId: string) => `derived/${dayId}/${frameId}/`;

/**
 * Reads one stored frame: capture data, previews, slate. Idempotent: a frame already read is
 * left alone, and a retried job overwrites the same derived keys and the same row. A file that
 * cannot be read gets its reason on the row, so the day never waits on it.
 */
export function createFrameIngest(deps: {
  db: Db;
  storage: ObjectStorage;
  maxPixels: number;
  logger: Logger;
}) {
  const { db, storage, logger } = deps;

  return async function ingestFrame(frameId: string, attempt: { lastAttempt: boolean }) {
    const frame = await repo.findFrame(db, frameId);
    if (frame?.ingestStatus !== 'read' && frame) await readOne(frame, attempt);
  };

  async function readOne(frame: repo.StoredFrame, attempt: { lastAttempt: boolean }) {
    await repo.markReading(db, frame.id);
    const scratch = await mkdtemp(path.join(os.tmpdir(), 'likeness-ingest-'));
    try {
      const filePath = path.join(scratch, 'original');
      await pipeline(await storage.read(frame.originalKey), createWriteStream(filePath));
      const reading = await readFrameFile({
        filePath,
        cardPath: frame.cardPath,
        maxPixels: deps.maxPixels,
      });
      const prefix = derivedPrefix(frame.dayId, frame.id);
      let previewKey: string | null = null;
      let thumbnailKey: string | null = null;
      if (reading.preview && reading.thumbnail) {
        previewKey = `${prefix}preview.jpg`;
        thumbnailKey = `${prefix}thumbnail.jpg`;
        await storage.put(previewKey, reading.preview, { contentType: 'image/jpeg' });
        await storage.put(thumbnailKey, reading.thumbnail, { contentType: 'image/jpeg' });
      }
      await db.transaction().execute(async (trx) => {
        await repo.saveReading(trx, frame.id, {
          previewKey,
          thumbnailKey,
          noPreview: reading.preview === null,
          cameraSerial: reading.capture.cameraSerial,
          cameraMake: reading.capture.make,
          cameraModel: reading.capture.model,
          capturedLocal: reading.capture.capturedLocal,
          captureOffset: reading.capture.offset,
          orientation: reading.capture.orientation,
          pixelWidth: reading.width ?? reading.capture.pixelWidth,
          pixelHeight: reading.height ?? reading.capture.pixelHeight,
          slateToken: reading.slateTokens[0] ?? null,
        });
        await queueDayMatch(trx, frame.dayId, 'frames');
      });
    } catch (error) {
      if (error instanceof FrameReadError || attempt.lastAttempt) {
        logger.warn({ err: error, frameId: frame.id }, 'frame could not be read');
        await db.transaction().execute(async (trx) => {
          await repo.saveFailure(trx, frame.id, readableReason(error));
          // A frame that cannot be read is still a frame of the day: it is shown as left over.
          await queueDayMatch(trx, frame.dayId, 'frames');
        });
        return;
      }
      throw error;
    } finally {
      await rm(scratch, { recursive: true, force: true });
    }
  }
}

function readableReason(error: unknown): string {
  if (error instanceof FrameReadError) return error.message;
  return 'The frame could not be read; it was tried three times.';
}
