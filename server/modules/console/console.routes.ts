import type { Notifications } from '../../adapters/notifications';
import type { RouteTable } from '../../lib/route-table';
import { viewerOf } from '../../lib/route-table';
import { parseId, parseInput } from '../../lib/validate';
import type { Lifecycle } from '../../runtime/lifecycle';
import {
  consoleActionSchema,
  consoleEventsQuerySchema,
  rosterSearchQuerySchema,
} from '../../schemas/console';
import type { ConsoleService } from './console.service';

const viewers = ['studio_admin', 'photographer', 'coordinator'] as const;
const actors = ['studio_admin', 'photographer'] as const;

export function registerConsoleRoutes(
  routes: RouteTable,
  service: ConsoleService,
  notifications: Notifications | undefined,
  lifecycle?: Lifecycle,
) {
  routes.add('get', '/console/days', viewers, async (req, res) => {
    res.json({ days: await service.days(viewerOf(req)) });
  });

  routes.add('get', '/days/:dayId/console', viewers, async (req, res) => {
    res.json(await service.snapshot(viewerOf(req), parseId(req.params.dayId, 'That shoot day')));
  });

  routes.add('get', '/days/:dayId/console/roster', viewers, async (req, res) => {
    const dayId = parseId(req.params.dayId, 'That shoot day');
    const { q } = parseInput(rosterSearchQuerySchema, req.query);
    res.json({ people: await service.searchRoster(viewerOf(req), dayId, q) });
  });

  routes.add('post', '/days/:dayId/console/actions', actors, async (req, res) => {
    const dayId = parseId(req.params.dayId, 'That shoot day');
    const action = parseInput(consoleActionSchema, req.body);
    const result = await service.act(viewerOf(req), dayId, action);
    res.status(result.replayed ? 200 : 201).json(result);
  });

  // Server-sent events: "changed" whenever any tablet (on any app process) changes the day.
  routes.add('get', '/days/:dayId/console/events', viewers, async (req, res) => {
    const dayId = parseId(req.params.dayId, 'That shoot day');
    parseInput(consoleEventsQuerySchema, req.query);
    await service.dayFor(viewerOf(req), dayId, 'view');
    res.writeHead(200, {
      'Content-Type': 'text/event-stream',
      'Cache-Control': 'no-store',
      Connection: 'keep-alive',
      'X-Accel-Buffering': 'no',
    });
    res.write('retry: 1000\n\nevent: ready\ndata: {}\n\n');
    // A refresh (the listener was reconnected, changes may have been missed) is sent as a
    // `changed` too: the tablet reloads the whole day either way.
    const unsubscribe = notifications?.subscribe(dayId, (event) => {
      const data = event === 'refresh' ? { dayId, refresh: true } : { dayId };
      res.write(`event: changed\ndata: ${JSON.stringify(data)}\n\n`);
    });
    // A comment line now and then keeps proxies from closing a quiet stream.
    const heartbeat = setInterval(() => res.write(': still here\n\n'), 15_000);
    // A stopping process ends its streams: the tablet's EventSource reconnects (retry above),
    // through the load balancer, to a process that stays.
    const stopOnDrain = lifecycle?.onDrain(() => res.end());
    // The response closes when the tablet goes away (tab closed, network lost).
    res.on('close', () => {
      clearInterval(heartbeat);
      unsubscribe?.();
      stopOnDrain?.();
    });
  });
}
