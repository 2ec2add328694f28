import type { RouteTable } from '../../lib/route-table';
import { viewerOf } from '../../lib/route-table';
import { parseId, parseInput } from '../../lib/validate';
import { matchDecisionRequestSchema } from '../../schemas/matching';
import type { MatchingService } from './matching.service';

const studio = ['studio_admin', 'photographer'] as const;

export function registerMatchingRoutes(routes: RouteTable, matching: MatchingService) {
  const dayOf = (params: Record<string, unknown>) => parseId(params.dayId, 'That shoot day');

  routes.add('get', '/days/:dayId/review', studio, async (req, res) => {
    res.json(await matching.review(viewerOf(req), dayOf(req.params)));
  });

  routes.add('post', '/days/:dayId/review/decisions', studio, async (req, res) => {
    const request = parseInput(matchDecisionRequestSchema, req.body);
    res.status(201).json(await matching.decide(viewerOf(req), dayOf(req.params), request));
  });

  routes.add('post', '/days/:dayId/review/undo', studio, async (req, res) => {
    res.json(await matching.undoLast(viewerOf(req), dayOf(req.params)));
  });

  routes.add('post', '/days/:dayId/review/run', studio, async (req, res) => {
    res.status(202).json(await matching.requestRun(viewerOf(req), dayOf(req.params)));
  });
}
