import { promises as fs } from 'node:fs';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { FileMigrationProvider, Kysely, Migrator, PostgresDialect } from 'kysely';
import pg from 'pg';

const migrationFolder = path.resolve(
  path.dirname(fileURLToPath(import.meta.url)),
  '../../migrations',
);

/** Runs every pending migration; throws with the failing migration's name. */
export async function migrateToLatest(connectionString: string): Promise<string[]> {
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
