import { spawnSync } from 'node:child_process';
import { readdirSync } from 'node:fs';
import path from 'node:path';
import pg from 'pg';
import { register } from 'tsx/esm/api';
import { inject } from 'vitest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { migrateToLatest } from '../../server/db/migrator';

// Several processes starting at once against one empty database (a deploy of several web
// processes and a worker): exactly one applies the migrations, the others wait and find
// nothing left to do, and none fails. (Kysely's migrator and graphile-worker's each hold a
// PostgreSQL advisory lock while they migrate; this keeps that proven.)

const name = `migrate_${Date.now().toString(36)}`;
let url: string;

async function admin<T>(work: (client: pg.Client) => Promise<T>): Promise<T> {
  const client = new pg.Client({ connectionString: inject('pgAdminUrl') });
  await client.connect();
  try {
    return await work(client);
  } finally {
    await client.end();
  }
}

beforeAll(async () => {
  await admin((client) => client.query(`create database ${name}`));
  const parsed = new URL(inject('pgAdminUrl'));
  parsed.pathname = `/${name}`;
  url = parsed.toString();
});

afterAll(() => admin((client) => client.query(`drop database if exists ${name} with (force)`)));

describe('migrations started by several processes at once', () => {
  it('are applied once, and every starter succeeds', async () => {
    const files = readdirSync(path.resolve(import.meta.dirname, '../../migrations')).filter(
      (file) => file.endsWith('.ts'),
    );
    // The migrator imports .ts migration files natively; tsx teaches Node to load them here.
    const unregister = register();
    const runs = await Promise.allSettled(Array.from({ length: 4 }, () => migrateToLatest(url)));
    await unregister();
    expect(
      runs.map((run) => (run.status === 'rejected' ? String(run.reason) : run.status)),
    ).toEqual(['fulfilled', 'fulfilled', 'fulfilled', 'fulfilled']);
    const applied = runs.map((run) => (run.status === 'fulfilled' ? run.value.length : -1));
    expect(applied.filter((count) => count === files.length)).toHaveLength(1);
    expect(applied.filter((count) => count === 0)).toHaveLength(3);
  });
});

describe('npm run migrate', () => {
  const root = path.resolve(import.meta.dirname, '../..');
  const migrate = (env: Record<string, string>) =>
    spawnSync(process.execPath, ['--import', 'tsx', 'server/migrate.ts'], {
      cwd: root,
      encoding: 'utf8',
      env: { ...process.env, ...env },
    });

  it('applies nothing more to a migrated database, and says so', () => {
    const run = migrate({ DATABASE_URL: url });
    expect(run.stderr).toBe('');
    expect(run.status).toBe(0);
    expect(run.stdout).toBe('Nothing to migrate.\n');
  });

  it('asks for DATABASE_URL without one', () => {
    const run = migrate({ DATABASE_URL: '' });
    expect(run.status).toBe(2);
    expect(run.stderr).toMatch(/Set DATABASE_URL/);
  });
});
