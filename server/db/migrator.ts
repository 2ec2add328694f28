import { existsSync, promises as fs } from 'node:fs';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { runMigrations } from 'graphile-worker';
import { FileMigrationProvider, Kysely, Migrator, PostgresDialect } from 'kysely';
import pg from 'pg';

const sourceMigrations = path.resolve(
  path.dirname(fileURLToPath(import.meta.url)),
  '../../migrations',
);

/**
 * The migrations an entry runs: compiled ones beside a built entry (dist/server/migrations,
 * as `npm run build` lays them out), else the TypeScript sources (run through tsx).
 */
export function migrationFolderFor(entryUrl: string): string {
  const beside = path.join(path.dirname(fileURLToPath(entryUrl)), 'migrations');
  return existsSync(beside) ? beside : sourceMigrations;
}

/**
 * Runs every pending migration; throws with the failing migration's name. graphile-worker's
 * own schema comes first: every transaction that adds a job needs graphile_worker.add_job, and
 * the migration that retired the old job table moves its waiting jobs over with it.
 */
export async function migrateToLatest(
  connectionString: string,
  migrationFolder = sourceMigrations,
): Promise<string[]> {
  await runMigrations({ connectionString });
  // Migrations get a plain Kysely (no camel-case plugin): they speak the database's own names.
  const db = new Kysely<unknown>({
    dialect: new PostgresDialect({ pool: new pg.Pool({ connectionString, max: 1 }) }),
  });
  try {
    const migrator = new Migrator({
      db,
      provider: new FileMigrationProvider({ fs, path, migrationFolder }),
    });
    const { error, results } = await migrator.migrateToLatest();
    const failed = results?.find((result) => result.status === 'Error');
    if (error || failed) {
      const name = failed?.migrationName ?? 'unknown migration';
      throw new Error(`Migration ${name} failed: ${String(error)}`);
    }
    return (results ?? []).map((result) => result.migrationName);
  } finally {
    await db.destroy();
  }
}
