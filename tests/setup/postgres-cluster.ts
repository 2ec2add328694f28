import { chmodSync, mkdtempSync, rmSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import pg from 'pg';
import { register } from 'tsx/esm/api';
import { migrateToLatest } from '../../server/db/migrator';
import { freePort, startCluster, type RunningCluster } from '../../scripts/lib/postgres-cluster';

export const TEMPLATE_DATABASE = 'likeness_template';

export interface TestCluster {
  adminUrl: string;
  stop(): void;
}

/** A throw-away cluster with a migrated template database that each test file clones. */
export async function startTestCluster(
  options: { settings?: string[] } = {},
): Promise<TestCluster> {
  const folder = mkdtempSync(path.join(os.tmpdir(), 'likeness-test-pg-'));
  // The cluster's owner (the postgres user, when tests run as root) must be able to enter it.
  chmodSync(folder, 0o755);
  const dataFolder = path.join(folder, 'data');
  let cluster: RunningCluster;
  try {
    cluster = await startCluster({
      dataFolder,
      port: await freePort(),
      disposable: true,
      settings: options.settings,
    });
  } catch (error) {
    rmSync(folder, { recursive: true, force: true });
    throw error;
  }
  const stop = () => {
    cluster.stop();
    rmSync(folder, { recursive: true, force: true });
  };
  // A run that is interrupted still stops its server (pg_ctl is synchronous, so this works on exit).
  process.once('exit', stop);
  try {
    const adminUrl = cluster.urlFor('postgres');
    const client = new pg.Client({ connectionString: adminUrl });
    await client.connect();
    await client.query(`create database ${TEMPLATE_DATABASE}`);
    await client.end();
    // The migrator imports .ts migration files natively; tsx teaches Node to load them here.
    const unregister = register();
    try {
      await migrateToLatest(cluster.urlFor(TEMPLATE_DATABASE));
    } finally {
      await unregister();
    }
    return {
      adminUrl,
      stop() {
        process.removeListener('exit', stop);
        stop();
      },
    };
  } catch (error) {
    process.removeListener('exit', stop);
    stop();
    throw error;
  }
}
