import { chmodSync, mkdtempSync, rmSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { register } from 'tsx/esm/api';
import { createDatabase } from '../../server/db/database';
import { migrateToLatest } from '../../server/db/migrator';
import {
  ensureDatabase,
  freePort,
  startCluster,
  type RunningCluster,
} from '../../scripts/lib/postgres-cluster';
import type { TestDatabase } from './test-database';

export interface StoppableDatabase extends TestDatabase {
  /** Stops PostgreSQL the way an outage would: open connections are cut. */
  stopServer(): void;
  /** Starts it again on the same port and data, as after an outage. */
  startServer(): Promise<void>;
}

/**
 * A migrated database on a private cluster of its own, so a fault test can stop and restart
 * PostgreSQL without touching the cluster the other test files share.
 */
export async function createStoppableDatabase(): Promise<StoppableDatabase> {
  const folder = mkdtempSync(path.join(os.tmpdir(), 'likeness-outage-pg-'));
  chmodSync(folder, 0o755);
  const dataFolder = path.join(folder, 'data');
  const port = await freePort();
  let cluster: RunningCluster = await startCluster({ dataFolder, port, disposable: true });
  const removeAll = () => {
    cluster.stop();
    rmSync(folder, { recursive: true, force: true });
  };
  process.once('exit', removeAll);
  const url = await ensureDatabase(cluster, 'likeness');
  const unregister = register();
  try {
    await migrateToLatest(url);
  } finally {
    await unregister();
  }
  const db = createDatabase(url, { maxConnections: 10 });
  return {
    url,
    db,
    stopServer: () => cluster.stop(),
    async startServer() {
      cluster = await startCluster({ dataFolder, port, disposable: true });
    },
    async drop() {
      await db.destroy();
      process.removeListener('exit', removeAll);
      removeAll();
    },
  };
}
