import type { RouteTable } from '../../lib/route-table';
import { viewerOf } from '../../lib/route-table';
import { parseId, parseInput } from '../../lib/validate';
import { inviteStaffRequestSchema, updateUserRequestSchema } from '../../schemas/users';
import type { UsersService } from './users.service';

export function registerUsersRoutes(routes: RouteTable, users: UsersService) {
  routes.add('get', '/users', ['studio_admin'], async (_req, res) => {
    res.json({ users: await users.list() });
  });

  routes.add('post', '/users', ['studio_admin'], async (req, res) => {
    const input = parseInput(inviteStaffRequestSchema, req.body);
    res.status(201).json(await users.invite(viewerOf(req), input));
  });

  routes.add('patch', '/users/:userId', ['studio_admin'], async (req, res) => {
    const id = parseId(req.params.userId, 'That account');
    const { active } = parseInput(updateUserRequestSchema, req.body);
    res.json(await users.setActive(viewerOf(req), id, active));
  });

  routes.add('post', '/users/:userId/invitation', ['studio_admin'], async (req, res) => {
    const id = parseId(req.params.userId, 'That account');
    await users.resendInvitation(viewerOf(req), id);
    res.status(202).json({ message: 'A new link to choose a password is on its way.' });
  });
}
