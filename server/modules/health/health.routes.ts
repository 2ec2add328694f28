import { sql } from 'kysely';
import type { Db } from '../../db/database';
import type { RouteTable } from '../../lib/route-table';
import type { Health } from '../../schemas/health';

export function registerHealthRoutes(routes: RouteTable, db: Db, mail: Health['mail']) {
  routes.add('get', '/health', 'public', async (_req, res) => {
    const started = performance.now();
    let database: Health['database'];
    try {
      await sql`select 1`.execute(db);
      database = { state: 'up', latencyMs: Math.round((performance.now() - started) * 10) / 10 };
    } catch {
      database = { state: 'down', latencyMs: null };
    }
    const body: Health = {
      status: database.state === 'up' ? 'ok' : 'degraded',
      database,
      mail,
      time: new Date().toISOString(),
    };
    res.status(database.state === 'up' ? 200 : 503).json(body);
  });
}
