import type { RouteTable } from '../../lib/route-table';
import { viewerOf } from '../../lib/route-table';
import { parseId, parseInput } from '../../lib/validate';
import {
  createBookingRequestSchema,
  moveBookingRequestSchema,
  sittingNeedsSchema,
} from '../../schemas/booking';
import type { BookingService } from './booking.service';

export function registerBookingRoutes(routes: RouteTable, booking: BookingService) {
  // The days a sitter is invited to, each with their booking if they have one.
  routes.add('get', '/sitters/me/days', ['sitter'], async (req, res) => {
    res.json({ days: await booking.sitterDays(viewerOf(req)) });
  });

  routes.add('post', '/bookings', ['sitter', 'coordinator', 'studio_admin'], async (req, res) => {
    const input = parseInput(createBookingRequestSchema, req.body);
    const result = await booking.create(viewerOf(req), input);
    res.status(result.created ? 201 : 200).json(result.booking);
  });

  routes.add(
    'patch',
    '/bookings/:bookingId',
    ['sitter', 'coordinator', 'studio_admin'],
    async (req, res) => {
      const id = parseId(req.params.bookingId, 'That booking');
      const input = parseInput(moveBookingRequestSchema, req.body);
      res.json(await booking.move(viewerOf(req), id, input.startsAt));
    },
  );

  routes.add(
    'delete',
    '/bookings/:bookingId',
    ['sitter', 'coordinator', 'studio_admin'],
    async (req, res) => {
      const id = parseId(req.params.bookingId, 'That booking');
      res.json(await booking.cancel(viewerOf(req), id));
    },
  );

  // The answers given at booking (name for files, glasses, flash, access needs).
  routes.add(
    'put',
    '/bookings/:bookingId/answers',
    ['sitter', 'coordinator', 'studio_admin'],
    async (req, res) => {
      const id = parseId(req.params.bookingId, 'That booking');
      const input = parseInput(sittingNeedsSchema, req.body);
      res.json(await booking.updateNeeds(viewerOf(req), id, input));
    },
  );

  routes.add(
    'get',
    '/bookings/:bookingId/calendar.ics',
    ['sitter', 'coordinator', 'studio_admin'],
    async (req, res) => {
      const id = parseId(req.params.bookingId, 'That booking');
      const ics = await booking.calendarFile(viewerOf(req), id);
      res.setHeader('Content-Disposition', 'attachment; filename="portrait-sitting.ics"');
      res.type('text/calendar; charset=utf-8').send(ics);
    },
  );

  routes.add(
    'get',
    '/bookings/:bookingId/pass.png',
    ['sitter', 'coordinator', 'studio_admin', 'photographer'],
    async (req, res) => {
      const png = await booking.pass(viewerOf(req), parseId(req.params.bookingId, 'That booking'));
      res.type('image/png').send(png);
    },
  );
}
