import type { RouteTable } from '../../lib/route-table';
import { viewerOf } from '../../lib/route-table';
import { parseId, parseInput } from '../../lib/validate';
import { confirmDayRequestSchema, createDayRequestSchema } from '../../schemas/days';
import type { BookingService } from '../booking/booking.service';
import type { DaysService } from './days.service';

export function registerDaysRoutes(routes: RouteTable, days: DaysService, booking: BookingService) {
  routes.add('get', '/days', ['studio_admin', 'coordinator', 'photographer'], async (req, res) => {
    res.json({ days: await days.list(viewerOf(req)) });
  });

  // The studio creates confirmed days; a coordinator's day is a proposal the studio staffs.
  routes.add('post', '/days', ['studio_admin', 'coordinator'], async (req, res) => {
    const input = parseInput(createDayRequestSchema, req.body);
    res.status(201).json(await days.create(viewerOf(req), input));
  });

  routes.add(
    'get',
    '/days/:dayId',
    ['studio_admin', 'coordinator', 'photographer'],
    async (req, res) => {
      res.json(await days.get(viewerOf(req), parseId(req.params.dayId, 'That shoot day')));
    },
  );

  routes.add('post', '/days/:dayId/confirmation', ['studio_admin'], async (req, res) => {
    const id = parseId(req.params.dayId, 'That shoot day');
    const input = parseInput(confirmDayRequestSchema, req.body);
    res.json(await days.confirm(viewerOf(req), id, input));
  });

  routes.add(
    'get',
    '/days/:dayId/slots',
    ['studio_admin', 'coordinator', 'photographer', 'sitter'],
    async (req, res) => {
      res.json(await booking.slots(viewerOf(req), parseId(req.params.dayId, 'That shoot day')));
    },
  );
}
