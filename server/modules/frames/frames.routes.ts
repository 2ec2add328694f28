import { pipeline } from 'node:stream/promises';
import type { Response } from 'express';
import type { RouteTable } from '../../lib/route-table';
import { viewerOf } from '../../lib/route-table';
import { parseId, parseInput } from '../../lib/validate';
import { frameListQuerySchema, knownFramesRequestSchema } from '../../schemas/frames';
import type { FramesService } from './frames.service';

const studio = ['studio_admin', 'photographer'] as const;

export function registerFramesRoutes(routes: RouteTable, frames: FramesService) {
  routes.add('get', '/days/:dayId/frames/overview', studio, async (req, res) => {
    res.json(await frames.overview(viewerOf(req), parseId(req.params.dayId, 'That shoot day')));
  });

  // Coordinators may ask, and get counts only.
  routes.add('get', '/days/:dayId/frames', [...studio, 'coordinator'], async (req, res) => {
    const query = parseInput(frameListQuerySchema, req.query);
    const dayId = parseId(req.params.dayId, 'That shoot day');
    if (query.format === 'csv') {
      const csv = await frames.exportCsv(viewerOf(req), dayId, query);
      res.setHeader('Content-Type', 'text/csv; charset=utf-8');
      res.setHeader('Content-Disposition', `attachment; filename="frames-${dayId}.csv"`);
      res.send(csv);
      return;
    }
    res.json(await frames.list(viewerOf(req), dayId, query));
  });

  routes.add('post', '/days/:dayId/frames/known', studio, async (req, res) => {
    const request = parseInput(knownFramesRequestSchema, req.body);
    res.json(
      await frames.knownFiles(viewerOf(req), parseId(req.params.dayId, 'That shoot day'), request),
    );
  });

  for (const which of ['thumbnail', 'preview', 'original'] as const) {
    routes.add('get', `/frames/:frameId/${which}`, studio, async (req, res) => {
      const file = await frames.openFile(
        viewerOf(req),
        parseId(req.params.frameId, 'That frame'),
        which,
      );
      await sendFile(res, file, which === 'original');
    });
  }
}

async function sendFile(
  res: Response,
  file: Awaited<ReturnType<FramesService['openFile']>>,
  asDownload: boolean,
) {
  res.setHeader('Content-Type', file.contentType);
  res.setHeader('Content-Length', String(file.size));
  // Frames are people's faces: a shared cache must never keep them.
  res.setHeader('Cache-Control', 'private, max-age=300');
  if (asDownload) {
    res.setHeader(
      'Content-Disposition',
      `attachment; filename*=UTF-8''${encodeURIComponent(file.fileName)}`,
    );
  }
  await pipeline(file.stream, res);
}
