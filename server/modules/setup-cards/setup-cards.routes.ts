import type { RouteTable } from '../../lib/route-table';
import { viewerOf } from '../../lib/route-table';
import { parseId, parseInput } from '../../lib/validate';
import { copySetupCardRequestSchema, saveSetupCardRequestSchema } from '../../schemas/setup-card';
import type { SetupCardsService } from './setup-cards.service';

const studio = ['studio_admin', 'photographer'] as const;

export function registerSetupCardsRoutes(routes: RouteTable, cards: SetupCardsService) {
  routes.add('get', '/days/:dayId/setup-cards', studio, async (req, res) => {
    res.json(await cards.forDay(viewerOf(req), parseId(req.params.dayId, 'That shoot day')));
  });

  routes.add('get', '/setup-card-sources', studio, async (req, res) => {
    res.json({ sources: await cards.sources(viewerOf(req)) });
  });

  routes.add('put', '/stations/:stationId/setup-card', studio, async (req, res) => {
    const stationId = parseId(req.params.stationId, 'That station');
    const { card } = parseInput(saveSetupCardRequestSchema, req.body);
    await cards.save(viewerOf(req), stationId, card);
    res.status(204).end();
  });

  routes.add('post', '/stations/:stationId/setup-card/copy', studio, async (req, res) => {
    const stationId = parseId(req.params.stationId, 'That station');
    const { fromStationId } = parseInput(copySetupCardRequestSchema, req.body);
    await cards.copy(viewerOf(req), stationId, fromStationId);
    res.status(204).end();
  });
}
