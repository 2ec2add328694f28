import { CamelCasePlugin, Kysely, PostgresDialect } from 'kysely';
import pg from 'pg';
import { preparingPool } from './prepared-statements';
import type { Database } from './types';

export type Db = Kysely<Database>;

/** Connections per process for requests (README: size max_connections for every process). */
export const DEFAULT_POOL_SIZE = 10;

// A timestamp without zone (a camera's unzoned wall clock) stays the text it is: parsing it
// into a Date would silently place it in this process's time zone.
const TIMESTAMP_WITHOUT_ZONE_OID = 1114;
pg.types.setTypeParser(TIMESTAMP_WITHOUT_ZONE_OID, (value) => value);

export function createDatabase(
  connectionString: string,
  options: {
    maxConnections?: number;
    /** Off behind a connection pooler that cannot keep prepared statements (README). */
    prepareStatements?: boolean;
  } = {},
): Db {
  const pool = new pg.Pool({ connectionString, max: options.maxConnections ?? DEFAULT_POOL_SIZE });
  // An idle connection the server drops (restart, test database removed) must not crash the
  // process: the pool discards it and the next query opens a fresh one.
  pool.on('error', (error) => {
    process.emitWarning(`PostgreSQL connection lost: ${error.message}`);
  });
  return new Kysely<Database>({
    dialect: new PostgresDialect({
      pool: preparingPool(pool, { prepare: options.prepareStatements !== false }),
    }),
    plugins: [new CamelCasePlugin()],
  });
}
