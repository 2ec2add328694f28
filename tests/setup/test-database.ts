import { randomBytes } from 'node:crypto';
import pg from 'pg';
import { inject } from 'vitest';
import { createDatabase, type Db } from '../../server/db/database';
import { TEMPLATE_DATABASE } from './postgres-cluster';

export interface TestDatabase {
  url: string;
  db: Db;
  drop(): Promise<void>;
}

/** A fresh database cloned from the migrated template: each test file gets its own. */
export async function createTestDatabase(): Promise<TestDatabase> {
  const adminUrl = inject('pgAdminUrl');
  const name = `test_${randomBytes(6).toString('hex')}`;
  const admin = new pg.Client({ connectionString: adminUrl });
  await admin.connect();
  await admin.query(`create database ${name} template ${TEMPLATE_DATABASE}`);
  await admin.end();
  const url = new URL(adminUrl);
  url.pathname = `/${name}`;
  const db = createDatabase(url.toString(), { maxConnections: 20 });
  return {
    url: url.toString(),
    db,
    async drop() {
      await db.destroy();
      const cleanup = new pg.Client({ connectionString: adminUrl });
      await cleanup.connect();
      await cleanup.query(`drop database if exists ${name} with (force)`);
      await cleanup.end();
    },
  };
}

/** An empty database with no migrations applied: for tests of migrating itself. */
export async function createEmptyDatabase(): Promise<{ url: string; drop(): Promise<void> }> {
  const adminUrl = inject('pgAdminUrl');
  const name = `empty_${randomBytes(6).toString('hex')}`;
  const admin = new pg.Client({ connectionString: adminUrl });
  await admin.connect();
  await admin.query(`create database ${name} template template0`);
  await admin.end();
  const url = new URL(adminUrl);
  url.pathname = `/${name}`;
  return {
    url: url.toString(),
    async drop() {
      const cleanup = new pg.Client({ connectionString: adminUrl });
      await cleanup.connect();
      await cleanup.query(`drop database if exists ${name} with (force)`);
      await cleanup.end();
    },
  };
}
