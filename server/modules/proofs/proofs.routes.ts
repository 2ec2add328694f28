import { pipeline } from 'node:stream/promises';
import { z } from 'zod';
import type { RouteTable } from '../../lib/route-table';
import { viewerOf } from '../../lib/route-table';
import { parseId, parseInput } from '../../lib/validate';
import { uuidSchema } from '../../schemas/common';
import {
  proofSettingsSchema,
  releaseProofsRequestSchema,
  savePicksRequestSchema,
  studioPickRequestSchema,
} from '../../schemas/proofs';
import type { ProofsService } from './proofs.service';
import type { SitterProofsService } from './sitter-proofs.service';

const studio = ['studio_admin', 'photographer'] as const;

const proofImageQuerySchema = z.object({
  p: uuidSchema,
  e: z.coerce.number().int().min(0).max(4_102_444_800),
  s: z.string().regex(/^[A-Za-z0-9_-]{10,100}$/, { error: 'Not a proof link.' }),
});

export function registerProofsRoutes(
  routes: RouteTable,
  proofs: ProofsService,
  sitters: SitterProofsService,
) {
  const day = (value: unknown) => parseId(value, 'That shoot day');

  routes.add('get', '/proofs', ['sitter'], async (req, res) => {
    res.json({ days: await sitters.myDays(viewerOf(req)) });
  });
  routes.add('get', '/proofs/:dayId', ['sitter'], async (req, res) => {
    const viewer = viewerOf(req);
    res.json(await sitters.proofs(viewer, day(req.params.dayId), viewer.id));
  });
  routes.add('put', '/proofs/:dayId/picks', ['sitter'], async (req, res) => {
    const viewer = viewerOf(req);
    const request = parseInput(savePicksRequestSchema, req.body);
    res.json(await sitters.savePicks(viewer, day(req.params.dayId), viewer.id, request));
  });

  // Signed and expiring: the URL itself is the permission, so an <img> needs nothing else.
  routes.add('get', '/proof-images/:frameId', 'public', async (req, res) => {
    const query = parseInput(proofImageQuerySchema, req.query);
    const image = await sitters.proofImage({
      frameId: parseId(req.params.frameId, 'That proof'),
      personId: query.p,
      expires: query.e,
      sig: query.s,
    });
    res.setHeader('Content-Type', 'image/jpeg');
    res.setHeader('Content-Length', String(image.size));
    res.setHeader('Cache-Control', 'private, max-age=600');
    await pipeline(image.stream, res);
  });

  routes.add('get', '/days/:dayId/proofs', [...studio, 'coordinator'], async (req, res) => {
    res.json(await proofs.progress(viewerOf(req), day(req.params.dayId)));
  });
  routes.add('post', '/days/:dayId/proofs/release', studio, async (req, res) => {
    const input = parseInput(releaseProofsRequestSchema, req.body ?? {});
    res.status(201).json(await proofs.release(viewerOf(req), day(req.params.dayId), input));
  });
  routes.add('post', '/days/:dayId/proofs/remind', [...studio, 'coordinator'], async (req, res) => {
    res.status(201).json(await proofs.remind(viewerOf(req), day(req.params.dayId)));
  });
  routes.add('put', '/days/:dayId/proofs/studio-picks/:personId', studio, async (req, res) => {
    const { frameId } = parseInput(studioPickRequestSchema, req.body);
    const personId = parseId(req.params.personId, 'That sitter');
    res.json(await proofs.setStudioPick(viewerOf(req), day(req.params.dayId), personId, frameId));
  });

  // When the client lets HR choose for staff.
  routes.add('get', '/days/:dayId/proofs/people/:personId', ['coordinator'], async (req, res) => {
    const personId = parseId(req.params.personId, 'That sitter');
    res.json(await sitters.proofs(viewerOf(req), day(req.params.dayId), personId));
  });
  routes.add(
    'put',
    '/days/:dayId/proofs/people/:personId/picks',
    ['coordinator'],
    async (req, res) => {
      const personId = parseId(req.params.personId, 'That sitter');
      const request = parseInput(savePicksRequestSchema, req.body);
      res.json(await sitters.savePicks(viewerOf(req), day(req.params.dayId), personId, request));
    },
  );

  routes.add('get', '/clients/:clientId/proof-settings', ['studio_admin'], async (req, res) => {
    const clientId = parseId(req.params.clientId, 'That client');
    res.json(await proofs.settings(viewerOf(req), clientId));
  });
  routes.add('put', '/clients/:clientId/proof-settings', ['studio_admin'], async (req, res) => {
    const clientId = parseId(req.params.clientId, 'That client');
    const input = parseInput(proofSettingsSchema, req.body);
    res.json(await proofs.saveSettings(viewerOf(req), clientId, input));
  });
}
