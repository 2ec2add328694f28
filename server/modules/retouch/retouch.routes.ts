import { pipeline } from 'node:stream/promises';
import type { RouteTable } from '../../lib/route-table';
import { viewerOf } from '../../lib/route-table';
import { parseId, parseInput } from '../../lib/validate';
import { retouchQuerySchema, retouchUpdateSchema } from '../../schemas/proofs';
import type { RetouchService } from './retouch.service';

const studio = ['studio_admin', 'photographer'] as const;

export function registerRetouchRoutes(routes: RouteTable, retouch: RetouchService) {
  routes.add('get', '/days/:dayId/retouch', studio, async (req, res) => {
    const query = parseInput(retouchQuerySchema, req.query);
    res.json(
      await retouch.queue(viewerOf(req), parseId(req.params.dayId, 'That shoot day'), query),
    );
  });

  routes.add('patch', '/picks/:pickId', studio, async (req, res) => {
    const change = parseInput(retouchUpdateSchema, req.body);
    res.json(await retouch.update(viewerOf(req), parseId(req.params.pickId, 'That pick'), change));
  });

  routes.add('get', '/days/:dayId/retouch/originals.zip', studio, async (req, res) => {
    const dayId = parseId(req.params.dayId, 'That shoot day');
    res.setHeader('Content-Type', 'application/zip');
    res.setHeader('Cache-Control', 'private, no-store');
    res.setHeader('Content-Disposition', `attachment; filename="picks-${dayId}.zip"`);
    await retouch.writeOriginalsZip(viewerOf(req), dayId, res);
  });

  routes.add('get', '/picks/:pickId/final', studio, async (req, res) => {
    const file = await retouch.openFinal(viewerOf(req), parseId(req.params.pickId, 'That pick'));
    res.setHeader('Content-Type', 'application/octet-stream');
    res.setHeader('Content-Length', String(file.size));
    res.setHeader(
      'Content-Disposition',
      `attachment; filename*=UTF-8''${encodeURIComponent(file.fileName)}`,
    );
    await pipeline(file.stream, res);
  });
}
