import { sql } from 'kysely';
import type { Notifications } from '../../adapters/notifications';
import type { ObjectStorage } from '../../adapters/storage/storage';
import type { Db } from '../../db/database';
import { DATABASE_RETRY_AFTER_SECONDS } from '../../lib/database-unavailable';
import type { RouteTable } from '../../lib/route-table';
import type { Health, Readiness } from '../../schemas/health';

// A key that is never written: asking for it proves storage answers without touching files.
const STORAGE_PROBE_KEY = 'readiness/probe';

/**
 * Registered before the session cookie is read, so health answers (and says what is down)
 * even when the sessions table cannot be reached.
 */
export function registerHealthRoutes(
  routes: RouteTable,
  db: Db,
  mail: Health['mail'],
  notifications: Notifications | undefined,
  storage: ObjectStorage,
) {
  routes.add('get', '/health', 'public', async (_req, res) => {
    const started = performance.now();
    let database: Health['database'];
    try {
      await sql`select 1`.execute(db);
      database = { state: 'up', latencyMs: Math.round((performance.now() - started) * 10) / 10 };
    } catch {
      database = { state: 'down', latencyMs: null };
    }
    const listener: Health['listener'] = notifications
      ? notifications.status()
      : { state: 'off', reconnects: 0, failedAttempts: 0 };
    const body: Health = {
      // A listener that is reconnecting means tablets fall back to their slow refresh.
      status: database.state === 'up' && listener.state !== 'reconnecting' ? 'ok' : 'degraded',
      database,
      listener,
      mail,
      time: new Date().toISOString(),
    };
    res.setHeader('Cache-Control', 'no-store');
    if (database.state === 'down') {
      res.setHeader('Retry-After', String(DATABASE_RETRY_AFTER_SECONDS));
    }
    res.status(database.state === 'up' ? 200 : 503).json(body);
  });

  // Liveness is /health; readiness also needs the storage this process reads and writes.
  routes.add('get', '/ready', 'public', async (_req, res) => {
    const [database, store] = await Promise.all([
      sql`select 1`.execute(db).then(
        () => 'up' as const,
        () => 'down' as const,
      ),
      storage.stat(STORAGE_PROBE_KEY).then(
        () => 'up' as const,
        () => 'down' as const,
      ),
    ]);
    const body: Readiness = {
      ready: database === 'up' && store === 'up',
      database,
      storage: store,
    };
    res.setHeader('Cache-Control', 'no-store');
    if (!body.ready) res.setHeader('Retry-After', String(DATABASE_RETRY_AFTER_SECONDS));
    res.status(body.ready ? 200 : 503).json(body);
  });
}
