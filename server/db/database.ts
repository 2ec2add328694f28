import { CamelCasePlugin, Kysely, PostgresDialect } from 'kysely';
import pg from 'pg';
import type { Database } from './types';

export type Db = Kysely<Database>;

export function createDatabase(
  connectionString: string,
  options: { maxConnections?: number } = {},
): Db {
  const pool = new pg.Pool({ connectionString, max: options.maxConnections ?? 10 });
  // An idle connection the server drops (restart, test database removed) must not crash the
  // process: the pool discards it and the next query opens a fresh one.
  pool.on('error', (error) => {
    process.emitWarning(`PostgreSQL connection lost: ${error.message}`);
  });
  return new Kysely<Database>({
    dialect: new PostgresDialect({ pool }),
    plugins: [new CamelCasePlugin()],
  });
}
