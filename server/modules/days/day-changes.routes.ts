import type { RouteTable } from '../../lib/route-table';
import { viewerOf } from '../../lib/route-table';
import { parseId, parseInput } from '../../lib/validate';
import {
  cancelDayRequestSchema,
  dayChangesSchema,
  editDayRequestSchema,
  proposeDayChangeRequestSchema,
} from '../../schemas/day-changes';
import type { DayChangesService } from './day-changes.service';

/** Editing and cancelling a day (the studio), and the changes coordinators propose. */
export function registerDayChangesRoutes(routes: RouteTable, changes: DayChangesService) {
  const dayId = (value: unknown) => parseId(value, 'That shoot day');

  // Writes nothing: lists the bookings the edit would move or cancel.
  routes.add(
    'post',
    '/days/:dayId/changes/preview',
    ['studio_admin', 'coordinator'],
    async (req, res) => {
      const input = parseInput(dayChangesSchema, req.body);
      res.json(await changes.preview(viewerOf(req), dayId(req.params.dayId), input));
    },
  );

  routes.add('patch', '/days/:dayId', ['studio_admin'], async (req, res) => {
    const input = parseInput(editDayRequestSchema, req.body);
    res.json(
      await changes.apply(viewerOf(req), dayId(req.params.dayId), input.changes, input.proposalId),
    );
  });

  routes.add('post', '/days/:dayId/cancellation', ['studio_admin'], async (req, res) => {
    const input = parseInput(cancelDayRequestSchema, req.body);
    res.json(await changes.cancelDay(viewerOf(req), dayId(req.params.dayId), input));
  });

  routes.add('get', '/days/:dayId/proposals', ['studio_admin', 'coordinator'], async (req, res) => {
    res.json({ proposals: await changes.proposals(viewerOf(req), dayId(req.params.dayId)) });
  });

  routes.add('post', '/days/:dayId/proposals', ['coordinator'], async (req, res) => {
    const input = parseInput(proposeDayChangeRequestSchema, req.body);
    res.status(201).json(await changes.propose(viewerOf(req), dayId(req.params.dayId), input));
  });

  routes.add(
    'post',
    '/days/:dayId/proposals/:proposalId/decline',
    ['studio_admin'],
    async (req, res) => {
      const proposalId = parseId(req.params.proposalId, 'That proposal');
      res.json({
        proposals: await changes.decline(viewerOf(req), dayId(req.params.dayId), proposalId),
      });
    },
  );
}
