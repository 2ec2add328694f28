import { sql } from 'kysely';
import pg from 'pg';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createDatabase, type Db } from '../../server/db/database';
import { createCrossProcessUploadLocker } from '../../server/modules/frames/upload-locker';
import { isDatabaseUnavailable } from '../../server/lib/database-unavailable';
import { createTestDatabase, type TestDatabase } from '../setup/test-database';

// A connection the server cuts (pg_terminate_backend: SQLSTATE 57P01, "terminating connection
// due to administrator command", as in a restart) while a transaction holds it between two
// statements. node-postgres then emits 'error' on the client; unheard, Node ends the process.

let database: TestDatabase;
let db: Db;
beforeAll(async () => {
  database = await createTestDatabase();
  db = createDatabase(database.url);
});
afterAll(async () => {
  await db.destroy();
  await database.drop();
});

describe('a connection cut while a transaction holds it', () => {
  it('fails that transaction as an outage, and the pool goes on with a fresh connection', async () => {
    const admin = new pg.Client({ connectionString: database.url });
    await admin.connect();
    const warnings: string[] = [];
    const onWarning = (warning: Error) => warnings.push(warning.message);
    process.on('warning', onWarning);
    try {
      const outcome = db
        .transaction()
        .execute(async (trx) => {
          const { rows } = await sql<{ pid: number }>`select pg_backend_pid() as pid`.execute(trx);
          await admin.query('select pg_terminate_backend($1)', [rows[0]?.pid]);
          // Between statements: the server's message arrives while no query is running.
          await new Promise((resolve) => setTimeout(resolve, 200));
          await sql`select 1`.execute(trx);
        })
        .then(
          () => null,
          (error: unknown) => error,
        );
      const error = await outcome;
      expect(error).not.toBeNull();
      expect(isDatabaseUnavailable(error)).toBe(true);
      await expect
        .poll(() => warnings.some((text) => /connection lost while in use/.test(text)))
        .toBe(true);
      const { rows } = await sql<{ one: number }>`select 1 as one`.execute(db);
      expect(rows).toEqual([{ one: 1 }]);
    } finally {
      process.off('warning', onWarning);
      await admin.end();
    }
  });

  it('an upload lock cut while held ends only its lock; the next upload locks again', async () => {
    const admin = new pg.Client({ connectionString: database.url });
    await admin.connect();
    const locker = createCrossProcessUploadLocker(database.url);
    try {
      const lock = locker.newLock('card-1/frame-0001');
      await lock.lock(new AbortController().signal, () => undefined);
      // The lock's session, found by its advisory lock (class 7301, two-key form).
      const { rows } = await admin.query<{ pid: number }>(
        `select pid from pg_locks where locktype = 'advisory' and classid = 7301 and granted`,
      );
      expect(rows).toHaveLength(1);
      await admin.query('select pg_terminate_backend($1)', [rows[0]?.pid]);
      await new Promise((resolve) => setTimeout(resolve, 200));
      await lock.unlock();
      const again = locker.newLock('card-1/frame-0001');
      await again.lock(new AbortController().signal, () => undefined);
      await again.unlock();
    } finally {
      await locker.close();
      await admin.end();
    }
  });
});
