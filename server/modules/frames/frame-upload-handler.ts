import path from 'node:path';
import { FileStore } from '@tus/file-store';
import { Metadata, Server, type Locker, type Upload } from '@tus/server';
import cookieParser from 'cookie-parser';
import type { Express, NextFunction, Request, RequestHandler, Response } from 'express';
import { assertSameSite } from '../../lib/cross-site';
import { AppError, unauthenticated } from '../../lib/errors';
import type { Logger } from '../../lib/logger';
import { loadViewer } from '../../lib/session-cookie';
import type { Viewer } from '../../lib/viewer';
import type { FramesService } from './frames.service';

export const UPLOAD_PATH = '/api/uploads';
const DAY = 24 * 60 * 60 * 1000;

/** The Node request behind tus's web Request (srvx keeps it at runtime.node.req). */
function expressRequestOf(req: { runtime?: { node?: { req?: unknown } } }): Request {
  const original = req.runtime?.node?.req;
  if (!original) throw new Error('The upload request lost its Node request.');
  return original as Request;
}

function asTusError(error: unknown): { status_code: number; body: string } {
  if (error instanceof AppError) {
    return {
      status_code: error.status,
      body: JSON.stringify({ error: { code: error.code, message: error.message } }),
    };
  }
  throw error;
}

/**
 * Resumable uploads of camera files over the tus protocol. It is mounted before the API's
 * JSON-only guard (tus sends application/offset+octet-stream) and makes its own checks: a
 * signed-in studio admin or the day's photographer, same-site requests only, and a resumed
 * upload only by the person who started it.
 */
export function mountFrameUploads(
  app: Express,
  deps: {
    frames: FramesService;
    folder: string;
    maxBytes: number;
    resolveViewer: (token: string) => Promise<Viewer | null>;
    logger: Logger;
    /** Across processes in production (upload-locker.ts); tus's in-memory one otherwise. */
    locker?: Locker;
  },
) {
  const { frames, folder, logger } = deps;
  // A file abandoned halfway (a laptop never reopened) is dropped after a week.
  const store = new FileStore({ directory: folder, expirationPeriodInMilliseconds: 7 * DAY });
  const tus = new Server({
    path: UPLOAD_PATH,
    datastore: store,
    ...(deps.locker ? { locker: deps.locker } : {}),
    maxSize: deps.maxBytes,
    relativeLocation: true,
    namingFunction: (req) => {
      const id: unknown = expressRequestOf(req).res?.locals.uploadId;
      if (typeof id !== 'string') throw new Error('The upload was not checked before it started.');
      return id;
    },
    onUploadFinish: async (_req, upload: Upload) => {
      try {
        const result = await frames.finishUpload(upload.id, path.join(folder, upload.id));
        return {
          headers: {
            'Likeness-Upload-Outcome': result.outcome,
            'Likeness-Frame-Id': result.frameId,
          },
        };
      } catch (error) {
        logger.info({ uploadId: upload.id, err: error }, 'frame upload refused');
        throw asTusError(error);
      } finally {
        // The original now lives in storage (or was refused): the in-flight copy goes.
        await store.remove(upload.id).catch(() => undefined);
      }
    },
  });

  const sweep = () =>
    tus.cleanUpExpiredUploads().catch((error: unknown) => {
      logger.warn({ err: error }, 'could not remove expired uploads');
    });
  // Twice a day is plenty; the timer must not keep a stopping process alive.
  setInterval(() => void sweep(), DAY / 2).unref();

  const checkAccess: RequestHandler = async (req: Request, res: Response, next: NextFunction) => {
    try {
      if (req.method === 'OPTIONS') return next();
      const viewer = req.viewer;
      if (!viewer) throw unauthenticated();
      if (viewer.role !== 'studio_admin' && viewer.role !== 'photographer') {
        throw new AppError('forbidden', 403, 'Only the studio uploads frames.');
      }
      if (!['GET', 'HEAD'].includes(req.method)) assertSameSite(req);
      const id = req.path.slice(UPLOAD_PATH.length).replace(/^\//, '');
      if (req.method === 'POST' && id === '') {
        const length = req.get('upload-length');
        res.locals.uploadId = await frames.startUpload(viewer, {
          metadata: Metadata.parse(req.get('upload-metadata') ?? ''),
          declaredSize: length !== undefined && /^\d+$/.test(length) ? Number(length) : null,
        });
      } else if (id === '' || id.includes('/')) {
        throw new AppError('not_found', 404, 'That upload was not found.');
      } else {
        await frames.checkUploadAccess(viewer, id);
      }
      next();
    } catch (error) {
      next(error);
    }
  };

  const handlers: RequestHandler[] = [
    cookieParser(),
    loadViewer(deps.resolveViewer),
    checkAccess,
    (req, res) => {
      res.setHeader('Cache-Control', 'no-store');
      void tus.handle(req, res);
    },
  ];
  app.all(UPLOAD_PATH, ...handlers);
  app.all(`${UPLOAD_PATH}/{*rest}`, ...handlers);
}
