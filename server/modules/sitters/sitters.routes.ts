import type { Db } from '../../db/database';
import { notFound } from '../../lib/errors';
import type { RouteTable } from '../../lib/route-table';
import { viewerOf } from '../../lib/route-table';
import { findProfile } from './sitters.repository';

export function registerSittersRoutes(routes: RouteTable, db: Db) {
  // A sitter only ever reads themself: the id comes from the session, never from the request.
  routes.add('get', '/sitters/me', ['sitter'], async (req, res) => {
    const profile = await findProfile(db, viewerOf(req).id);
    if (!profile) throw notFound('Your roster entry');
    res.json(profile);
  });
}
