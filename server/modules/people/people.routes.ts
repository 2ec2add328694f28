import type { RouteTable } from '../../lib/route-table';
import { viewerOf } from '../../lib/route-table';
import { parseId, parseInput } from '../../lib/validate';
import { peopleQuerySchema } from '../../schemas/people';
import {
  erasePersonRequestSchema,
  savePersonRequestSchema,
  setActiveRequestSchema,
} from '../../schemas/roster';
import type { PeopleService } from './people.service';

const rosterRoles = ['studio_admin', 'coordinator'] as const;

export function registerPeopleRoutes(routes: RouteTable, people: PeopleService) {
  routes.add('get', '/clients/:clientId/people', rosterRoles, async (req, res) => {
    const clientId = parseId(req.params.clientId, 'That client');
    const query = parseInput(peopleQuerySchema, req.query);
    res.json(await people.list(viewerOf(req), clientId, query));
  });

  routes.add('get', '/clients/:clientId/people/export.csv', rosterRoles, async (req, res) => {
    const clientId = parseId(req.params.clientId, 'That client');
    const query = parseInput(peopleQuerySchema, req.query);
    const csv = await people.exportCsv(viewerOf(req), clientId, query);
    res.setHeader('Content-Type', 'text/csv; charset=utf-8');
    res.setHeader('Content-Disposition', 'attachment; filename="people.csv"');
    res.send(csv);
  });

  routes.add('post', '/clients/:clientId/people', rosterRoles, async (req, res) => {
    const clientId = parseId(req.params.clientId, 'That client');
    const input = parseInput(savePersonRequestSchema, req.body);
    res.status(201).json(await people.create(viewerOf(req), clientId, input));
  });

  routes.add('patch', '/clients/:clientId/people/:personId', rosterRoles, async (req, res) => {
    const clientId = parseId(req.params.clientId, 'That client');
    const personId = parseId(req.params.personId, 'That person');
    // { active } alone (de)activates; anything else is the edit form.
    const body: unknown = req.body;
    const onlyActive =
      typeof body === 'object' && body !== null && Object.keys(body).join() === 'active';
    const input = onlyActive
      ? parseInput(setActiveRequestSchema, body)
      : parseInput(savePersonRequestSchema, body);
    res.json(await people.update(viewerOf(req), clientId, personId, input));
  });

  routes.add(
    'post',
    '/clients/:clientId/people/:personId/erasure',
    rosterRoles,
    async (req, res) => {
      const clientId = parseId(req.params.clientId, 'That client');
      const personId = parseId(req.params.personId, 'That person');
      const { confirmEmail } = parseInput(erasePersonRequestSchema, req.body);
      await people.erase(viewerOf(req), clientId, personId, confirmEmail);
      res.status(204).end();
    },
  );
}
