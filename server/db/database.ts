import { CamelCasePlugin, Kysely, PostgresDialect } from 'kysely';
import pg from 'pg';
import type { Database } from './types';

export type Db = Kysely<Database>;

export function createDatabase(
  connectionString: string,
  options: { maxConnections?: number } = {},
): Db {
  const pool = new pg.Pool({ connectionString, max: options.maxConnections ?? 10 });
  return new Kysely<Database>({
    dialect: new PostgresDialect({ pool }),
    plugins: [new CamelCasePlugin()],
  });
}
