import { pipeline } from 'node:stream/promises';
import { z } from 'zod';
import type { RouteTable } from '../../lib/route-table';
import { viewerOf } from '../../lib/route-table';
import { parseId, parseInput } from '../../lib/validate';
import { controlCharacterPattern } from '../../schemas/common';
import { lookSchema, pointSchema } from '../../schemas/looks';
import type { LooksService } from './looks.service';
import type { PortraitsService } from './portraits.service';

const studio = ['studio_admin', 'photographer'] as const;
const templateSchema = z
  .string({ error: 'Give a file-name template.' })
  .trim()
  .min(1, { error: 'Give a file-name template.' })
  .max(200, { error: 'Keep the template to 200 characters.' })
  .refine((value) => !controlCharacterPattern.test(value), {
    error: 'The template contains control characters.',
  });
const saveLookSchema = lookSchema.extend({ fileNameTemplate: templateSchema }).strict();
const renditionNameSchema = z
  .string()
  .min(1)
  .max(60, { error: 'No rendition has a name that long.' })
  .refine((value) => !controlCharacterPattern.test(value), {
    error: 'A rendition name has no control characters.',
  });
const previewSchema = z.object({
  template: templateSchema,
  rendition: renditionNameSchema.default('portrait'),
});
const marksSchema = z.object({ leftEye: pointSchema, rightEye: pointSchema }).strict();

export function registerLooksRoutes(
  routes: RouteTable,
  looks: LooksService,
  portraits: PortraitsService,
) {
  const client = (value: unknown) => parseId(value, 'That client');
  const pick = (value: unknown) => parseId(value, 'That pick');

  routes.add(
    'get',
    '/clients/:clientId/look',
    ['studio_admin', 'coordinator'],
    async (req, res) => {
      res.json(await looks.look(viewerOf(req), client(req.params.clientId)));
    },
  );
  routes.add('put', '/clients/:clientId/look', ['studio_admin'], async (req, res) => {
    const input = parseInput(saveLookSchema, req.body);
    res.json(await looks.saveLook(viewerOf(req), client(req.params.clientId), input));
  });
  routes.add(
    'get',
    '/clients/:clientId/look/names',
    ['studio_admin', 'coordinator'],
    async (req, res) => {
      const query = parseInput(previewSchema, req.query);
      res.json(
        await looks.previewNames(
          viewerOf(req),
          client(req.params.clientId),
          query.template,
          query.rendition,
        ),
      );
    },
  );

  routes.add('get', '/days/:dayId/set', studio, async (req, res) => {
    res.json(await looks.daySet(viewerOf(req), parseId(req.params.dayId, 'That shoot day')));
  });
  routes.add('post', '/days/:dayId/set/prepare', studio, async (req, res) => {
    res
      .status(202)
      .json(await portraits.prepareDay(viewerOf(req), parseId(req.params.dayId, 'That shoot day')));
  });
  routes.add('put', '/picks/:pickId/eyes', studio, async (req, res) => {
    const marks = parseInput(marksSchema, req.body);
    res.json(await portraits.markEyes(viewerOf(req), pick(req.params.pickId), marks));
  });
  routes.add('get', '/picks/:pickId/source-preview', studio, async (req, res) => {
    const image = await portraits.sourcePreview(viewerOf(req), pick(req.params.pickId));
    res.setHeader('Content-Type', 'image/jpeg');
    res.setHeader('Cache-Control', 'private, max-age=300');
    res.send(image);
  });
  routes.add('get', '/picks/:pickId/renditions/:name', studio, async (req, res) => {
    const name = parseInput(renditionNameSchema, req.params.name);
    const file = await portraits.openRendition(viewerOf(req), pick(req.params.pickId), name);
    res.setHeader('Content-Type', 'image/jpeg');
    res.setHeader('Content-Length', String(file.size));
    res.setHeader('Cache-Control', 'private, no-cache');
    await pipeline(file.stream, res);
  });
}
