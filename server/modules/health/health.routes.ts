import { sql } from 'kysely';
import type { Notifications } from '../../adapters/notifications';
import type { ObjectStorage } from '../../adapters/storage/storage';
import type { Db } from '../../db/database';
import { DATABASE_RETRY_AFTER_SECONDS } from '../../lib/database-unavailable';
import type { RouteTable } from '../../lib/route-table';
import type { Lifecycle } from '../../runtime/lifecycle';
import type { Health, Readiness } from '../../schemas/health';

// A key that is never written: asking for it proves storage answers without touching files.
const STORAGE_PROBE_KEY = 'readiness/probe';

export interface HealthDeps {
  db: Db;
  mail: Health['mail'];
  notifications: Notifications | undefined;
  storage: ObjectStorage;
  /** Set in a process that runs jobs: readiness then also needs graphile-worker's queue. */
  runsJobs?: boolean;
  lifecycle?: Lifecycle;
}

const upOrDown = (probe: Promise<unknown>) =>
  probe.then(
    () => 'up' as const,
    () => 'down' as const,
  );

/**
 * Registered before the session cookie is read, so health answers (and says what is down)
 * even when the sessions table cannot be reached.
 */
export function registerHealthRoutes(routes: RouteTable, deps: HealthDeps) {
  const { db, notifications, storage } = deps;
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
      mail: deps.mail,
      time: new Date().toISOString(),
    };
    res.setHeader('Cache-Control', 'no-store');
    if (database.state === 'down') {
      res.setHeader('Retry-After', String(DATABASE_RETRY_AFTER_SECONDS));
    }
    res.status(database.state === 'up' ? 200 : 503).json(body);
  });

  // Liveness is /health; readiness also needs the storage (and queue) this process works with.
  routes.add('get', '/ready', 'public', async (_req, res) => {
    const [database, store, queue] = await Promise.all([
      upOrDown(sql`select 1`.execute(db)),
      upOrDown(storage.stat(STORAGE_PROBE_KEY)),
      deps.runsJobs
        ? upOrDown(sql`select count(*) from graphile_worker.jobs where false`.execute(db))
        : Promise.resolve('off' as const),
    ]);
    const draining = deps.lifecycle?.draining ?? false;
    const body: Readiness = {
      ready: database === 'up' && store === 'up' && queue !== 'down' && !draining,
      database,
      storage: store,
      queue,
      draining,
    };
    res.setHeader('Cache-Control', 'no-store');
    if (!body.ready) res.setHeader('Retry-After', String(DATABASE_RETRY_AFTER_SECONDS));
    res.status(body.ready ? 200 : 503).json(body);
  });
}
