import type { RouteTable } from '../../lib/route-table';
import { viewerOf } from '../../lib/route-table';
import { parseId, parseInput } from '../../lib/validate';
import { createClientRequestSchema } from '../../schemas/clients';
import type { ClientsService } from './clients.service';

export function registerClientsRoutes(routes: RouteTable, clients: ClientsService) {
  routes.add('get', '/clients', ['studio_admin', 'coordinator'], async (req, res) => {
    res.json({ clients: await clients.list(viewerOf(req)) });
  });

  routes.add('post', '/clients', ['studio_admin'], async (req, res) => {
    const input = parseInput(createClientRequestSchema, req.body);
    res.status(201).json(await clients.create(viewerOf(req), input));
  });

  routes.add('get', '/clients/:clientId', ['studio_admin', 'coordinator'], async (req, res) => {
    const id = parseId(req.params.clientId, 'That client');
    res.json(await clients.get(viewerOf(req), id));
  });
}
