import express, { type RequestHandler } from 'express';
import { AppError, notFound } from '../../lib/errors';
import type { RouteTable } from '../../lib/route-table';
import { viewerOf } from '../../lib/route-table';
import { parseId, parseInput } from '../../lib/validate';
import {
  commitImportRequestSchema,
  previewQuerySchema,
  remapRequestSchema,
  uploadQuerySchema,
} from '../../schemas/roster';
import type { RosterService } from './roster.service';

const rosterRoles = ['studio_admin', 'coordinator'] as const;

const rawParser = express.raw({ type: 'application/octet-stream', limit: '12mb' });

/**
 * The upload is the file's bytes as they are (application/octet-stream), so the server can
 * tell the encoding. Over 10 MB is refused by the service; a body far over that is cut here.
 * Who may upload is checked before a byte of the body is read: a sitter's or another client's
 * coordinator's large body is refused at once, not after it has been received.
 */
const readUpload: RequestHandler = (req, res, next) => {
  const viewer = req.viewer;
  if (!viewer) {
    next(new AppError('unauthenticated', 401, 'Please sign in to continue.'));
    return;
  }
  if (!(rosterRoles as readonly string[]).includes(viewer.role)) {
    next(new AppError('forbidden', 403, 'Your role does not allow this.'));
    return;
  }
  if (viewer.role === 'coordinator' && viewer.clientId !== req.params.clientId) {
    next(notFound('That client'));
    return;
  }
  rawParser(req, res, (error?: unknown) => {
    if (error) {
      next(
        new AppError(
          'file_too_large',
          413,
          'The file is larger than 10 MB. Split it or remove unused columns, then try again.',
        ),
      );
      return;
    }
    next();
  });
};

export function registerRosterRoutes(routes: RouteTable, roster: RosterService) {
  const base = '/clients/:clientId/roster/imports';

  routes.add(
    'post',
    base,
    rosterRoles,
    async (req, res) => {
      const clientId = parseId(req.params.clientId, 'That client');
      const { fileName } = parseInput(uploadQuerySchema, req.query);
      const body: unknown = req.body;
      const bytes = Buffer.isBuffer(body) ? new Uint8Array(body) : new Uint8Array();
      res.status(201).json(await roster.upload(viewerOf(req), clientId, fileName, bytes));
    },
    readUpload,
  );

  routes.add('get', `${base}/:importId`, rosterRoles, async (req, res) => {
    const clientId = parseId(req.params.clientId, 'That client');
    const draftId = parseId(req.params.importId, 'That import');
    res.json(await roster.get(viewerOf(req), clientId, draftId));
  });

  routes.add('put', `${base}/:importId/mapping`, rosterRoles, async (req, res) => {
    const clientId = parseId(req.params.clientId, 'That client');
    const draftId = parseId(req.params.importId, 'That import');
    const { mapping } = parseInput(remapRequestSchema, req.body);
    res.json(await roster.remap(viewerOf(req), clientId, draftId, mapping));
  });

  routes.add('get', `${base}/:importId/rows`, rosterRoles, async (req, res) => {
    const clientId = parseId(req.params.clientId, 'That client');
    const draftId = parseId(req.params.importId, 'That import');
    const query = parseInput(previewQuerySchema, req.query);
    res.json(await roster.previewRows(viewerOf(req), clientId, draftId, query));
  });

  routes.add('get', `${base}/:importId/errors.csv`, rosterRoles, async (req, res) => {
    const clientId = parseId(req.params.clientId, 'That client');
    const draftId = parseId(req.params.importId, 'That import');
    const file = await roster.errorCsv(viewerOf(req), clientId, draftId);
    res.setHeader('Content-Type', file.contentType);
    res.setHeader('Content-Disposition', 'attachment; filename="roster-rows-to-fix.csv"');
    res.send(file.body);
  });

  routes.add('post', `${base}/:importId/commit`, rosterRoles, async (req, res) => {
    const clientId = parseId(req.params.clientId, 'That client');
    const draftId = parseId(req.params.importId, 'That import');
    const input = parseInput(commitImportRequestSchema, req.body);
    const { summary, replayed } = await roster.commit(viewerOf(req), clientId, draftId, input);
    // Asking again after the save answers with the same import, as it was.
    res.status(replayed ? 200 : 201).json(summary);
  });

  routes.add('get', '/clients/:clientId/roster/open-import', rosterRoles, async (req, res) => {
    const clientId = parseId(req.params.clientId, 'That client');
    res.json({ draft: await roster.openDraft(viewerOf(req), clientId) });
  });

  routes.add('get', '/clients/:clientId/roster/history', rosterRoles, async (req, res) => {
    const clientId = parseId(req.params.clientId, 'That client');
    res.json({ imports: await roster.history(viewerOf(req), clientId) });
  });
}
