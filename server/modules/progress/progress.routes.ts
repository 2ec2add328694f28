import type { RouteTable } from '../../lib/route-table';
import { viewerOf } from '../../lib/route-table';
import { parseId } from '../../lib/validate';
import type { InvitationsService } from '../invitations/invitations.service';
import type { ProgressService } from './progress.service';

export function registerProgressRoutes(
  routes: RouteTable,
  progress: ProgressService,
  invitations: InvitationsService,
) {
  const dayId = (value: unknown) => parseId(value, 'That shoot day');

  routes.add(
    'get',
    '/clients/:clientId/progress',
    ['studio_admin', 'coordinator'],
    async (req, res) => {
      const clientId = parseId(req.params.clientId, 'That client');
      res.json(await progress.clientProgress(viewerOf(req), clientId));
    },
  );

  routes.add('get', '/days/:dayId/progress', ['studio_admin', 'coordinator'], async (req, res) => {
    res.json(await progress.progress(viewerOf(req), dayId(req.params.dayId)));
  });

  routes.add(
    'get',
    '/days/:dayId/schedule',
    ['studio_admin', 'coordinator', 'photographer'],
    async (req, res) => {
      res.json(await progress.schedule(viewerOf(req), dayId(req.params.dayId)));
    },
  );

  routes.add(
    'get',
    '/days/:dayId/recorded',
    ['studio_admin', 'coordinator', 'photographer'],
    async (req, res) => {
      res.json(await progress.recorded(viewerOf(req), dayId(req.params.dayId)));
    },
  );

  routes.add(
    'get',
    '/days/:dayId/schedule.csv',
    ['studio_admin', 'coordinator', 'photographer'],
    async (req, res) => {
      const file = await progress.scheduleCsv(viewerOf(req), dayId(req.params.dayId));
      res.setHeader('Content-Disposition', `attachment; filename="${file.name}"`);
      res.type('text/csv; charset=utf-8').send(file.csv);
    },
  );

  // Sending is a background job; these answer at once with how many were queued.
  routes.add(
    'post',
    '/days/:dayId/invitations',
    ['studio_admin', 'coordinator'],
    async (req, res) => {
      res.status(202).json(await invitations.invite(viewerOf(req), dayId(req.params.dayId)));
    },
  );

  routes.add(
    'post',
    '/days/:dayId/reminders',
    ['studio_admin', 'coordinator'],
    async (req, res) => {
      res.status(202).json(await invitations.remind(viewerOf(req), dayId(req.params.dayId)));
    },
  );

  routes.add('get', '/days/:dayId/mailings', ['studio_admin', 'coordinator'], async (req, res) => {
    res.json(await invitations.log(viewerOf(req), dayId(req.params.dayId)));
  });
}
