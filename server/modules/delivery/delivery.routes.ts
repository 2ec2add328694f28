import { pipeline } from 'node:stream/promises';
import type { Response } from 'express';
import { z } from 'zod';
import type { RouteTable } from '../../lib/route-table';
import { viewerOf } from '../../lib/route-table';
import { parseId, parseInput } from '../../lib/validate';
import { controlCharacterPattern } from '../../schemas/common';
import type { DeliveryService } from './delivery.service';

const studio = ['studio_admin', 'photographer'] as const;
const label = z
  .string()
  .max(200)
  .refine((value) => !controlCharacterPattern.test(value), {
    error: 'The office or department contains control characters.',
  });
const zipQuerySchema = z
  .object({ office: label.optional(), department: label.optional() })
  .strict();
const tokenSchema = z.string().regex(/^[A-Za-z0-9_-]{43}$/, { error: 'Not a download link.' });

export function registerDeliveryRoutes(routes: RouteTable, delivery: DeliveryService) {
  const day = (value: unknown) => parseId(value, 'That shoot day');

  routes.add('get', '/days/:dayId/delivery', [...studio, 'coordinator'], async (req, res) => {
    res.json(await delivery.status(viewerOf(req), day(req.params.dayId)));
  });
  routes.add('post', '/days/:dayId/delivery/release', studio, async (req, res) => {
    res.status(201).json(await delivery.release(viewerOf(req), day(req.params.dayId)));
  });
  routes.add(
    'get',
    '/days/:dayId/delivery.zip',
    ['studio_admin', 'coordinator'],
    async (req, res) => {
      const filter = parseInput(zipQuerySchema, req.query);
      const dayId = day(req.params.dayId);
      // Checked before the first byte, so a refusal is still a JSON error.
      await delivery.readableDay(viewerOf(req), dayId);
      res.setHeader('Content-Type', 'application/zip');
      res.setHeader('Cache-Control', 'private, no-store');
      res.setHeader('Content-Disposition', `attachment; filename="portraits-${dayId}.zip"`);
      const stored =
        filter.office || filter.department
          ? null
          : await delivery.storedArchive(viewerOf(req), dayId);
      if (!stored) {
        // Not written to storage yet (or a part of the set): streamed while it is made.
        await delivery.writeZip(viewerOf(req), dayId, filter, res);
        return;
      }
      // The whole set of this release is stored: a broken download resumes (RFC 9110 ranges).
      const etag = `"release-${stored.release}"`;
      res.setHeader('Accept-Ranges', 'bytes');
      res.setHeader('ETag', etag);
      const ifRange = req.headers['if-range'];
      const range = ifRange && ifRange !== etag ? null : byteRange(req.headers.range, stored.size);
      if (range === 'unsatisfiable') {
        res.status(416).setHeader('Content-Range', `bytes */${stored.size}`).end();
        return;
      }
      if (range) {
        res.status(206);
        res.setHeader('Content-Range', `bytes ${range.start}-${range.end}/${stored.size}`);
        res.setHeader('Content-Length', String(range.end - range.start + 1));
        await pipeline(await delivery.readArchive(stored.key, range), res);
        return;
      }
      res.setHeader('Content-Length', String(stored.size));
      await pipeline(await delivery.readArchive(stored.key), res);
    },
  );
  routes.add('delete', '/days/:dayId/delivery/links/:personId', studio, async (req, res) => {
    const personId = parseId(req.params.personId, 'That sitter');
    res.json(await delivery.revokeLinks(viewerOf(req), day(req.params.dayId), personId));
  });

  // The sitter's personal link: the token is the permission.
  routes.add('get', '/portraits/:token', 'public', async (req, res) => {
    res.json(await delivery.filesForLink(parseInput(tokenSchema, req.params.token)));
  });
  routes.add('get', '/portraits/:token/files/:fileId', 'public', async (req, res) => {
    const token = parseInput(tokenSchema, req.params.token);
    const set = await delivery.filesForLink(token);
    const file = await delivery.openDelivered(
      parseId(req.params.fileId, 'That portrait'),
      set.personId,
    );
    await sendDownload(res, file);
  });
  // And from their own account, signed in.
  routes.add('get', '/my-portraits/:dayId', ['sitter'], async (req, res) => {
    res.json(await delivery.filesOf(day(req.params.dayId), viewerOf(req).id));
  });
  routes.add('get', '/my-portraits/:dayId/files/:fileId', ['sitter'], async (req, res) => {
    const file = await delivery.openDelivered(
      parseId(req.params.fileId, 'That portrait'),
      viewerOf(req).id,
    );
    await sendDownload(res, file);
  });
}

/** One "bytes=start-end" range (or "bytes=start-" / "bytes=-suffix"); others are ignored. */
export function byteRange(
  header: string | undefined,
  size: number,
): { start: number; end: number } | 'unsatisfiable' | null {
  const match = header ? /^bytes=(\d*)-(\d*)$/.exec(header.trim()) : null;
  if (!match || (match[1] === '' && match[2] === '')) return null;
  const [start, end] =
    match[1] === ''
      ? [Math.max(0, size - Number(match[2])), size - 1]
      : [Number(match[1]), match[2] === '' ? size - 1 : Math.min(Number(match[2]), size - 1)];
  if (start >= size || start > end) return 'unsatisfiable';
  return { start, end };
}

async function sendDownload(
  res: Response,
  file: { stream: NodeJS.ReadableStream; fileName: string; size: number },
) {
  res.setHeader('Content-Type', 'image/jpeg');
  res.setHeader('Content-Length', String(file.size));
  res.setHeader('Cache-Control', 'private, no-store');
  res.setHeader(
    'Content-Disposition',
    `attachment; filename*=UTF-8''${encodeURIComponent(file.fileName)}`,
  );
  await pipeline(file.stream, res);
}
