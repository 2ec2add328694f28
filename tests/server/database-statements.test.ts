import { sql, type Kysely } from 'kysely';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createDatabase } from '../../server/db/database';
import { reusableQuery } from '../../server/db/reusable-query';
import { createTestDatabase, type TestDatabase } from '../setup/test-database';

// The database handle's two shortcuts for queries run again and again: statements prepared on
// the connection (prepared-statements.ts) and queries compiled once (reusable-query.ts). What
// PostgreSQL holds is read from its own view, pg_prepared_statements.

let database: TestDatabase;
// A table of the test's own, outside the app's schema.
type Db = Kysely<{ gadgets: { id: number; label: string; weightKg: string | null } }>;
let db: Db;

beforeAll(async () => {
  database = await createTestDatabase();
  // One connection, so every query below sees the same session's prepared statements.
  db = createDatabase(database.url, { maxConnections: 1 }) as unknown as Db;
  await sql`create table gadgets (id int primary key, label text)`.execute(db);
  await sql`insert into gadgets values (1, 'lamp'), (2, 'stand')`.execute(db);
});
afterAll(async () => {
  await db.destroy();
  await database.drop();
});

const preparedTexts = async () =>
  (
    await sql<{ statement: string }>`select statement from pg_prepared_statements`.execute(db)
  ).rows.map((row) => row.statement);

describe('statements prepared on the connection', () => {
  it('prepares a statement the third time it runs, and answers the same', async () => {
    const label = (id: number) =>
      db.selectFrom('gadgets').select('label').where('id', '=', id).executeTakeFirst();
    expect(await label(1)).toEqual({ label: 'lamp' });
    expect(await label(2)).toEqual({ label: 'stand' });
    expect((await preparedTexts()).some((text) => text.includes('from "gadgets"'))).toBe(false);
    expect(await label(1)).toEqual({ label: 'lamp' });
    expect(await label(2)).toEqual({ label: 'stand' });
    expect((await preparedTexts()).filter((text) => text.includes('from "gadgets"'))).toHaveLength(
      1,
    );
  });

  it('keeps answering after a migration changes the table under a prepared select *', async () => {
    const all = () => db.selectFrom('gadgets').selectAll().where('id', '=', 1).execute();
    for (let run = 0; run < 4; run += 1) await all();
    await sql`alter table gadgets add column weight_kg numeric`.execute(db);
    // PostgreSQL refuses the old statement's result shape; the handle runs the text afresh.
    expect(await all()).toEqual([{ id: 1, label: 'lamp', weightKg: null }]);
  });

  it('prepares nothing when told not to (behind a pooler that cannot keep them)', async () => {
    const plain = createDatabase(database.url, {
      maxConnections: 1,
      prepareStatements: false,
    }) as unknown as Db;
    try {
      for (let run = 0; run < 4; run += 1) {
        await plain.selectFrom('gadgets').select('id').where('id', '=', run).execute();
      }
      const held = await sql<{
        n: string;
      }>`select count(*) as n from pg_prepared_statements`.execute(plain);
      expect(held.rows[0]?.n).toBe('0');
    } finally {
      await plain.destroy();
    }
  });

  it('leaves transaction control and DDL alone', async () => {
    for (let run = 0; run < 4; run += 1) {
      await db.transaction().execute(async (trx) => {
        await sql`create temporary table scratch_${sql.raw(String(run))} (n int) on commit drop`.execute(
          trx,
        );
      });
    }
    const texts = await preparedTexts();
    expect(texts.some((text) => /^\s*(begin|commit|create)/i.test(text))).toBe(false);
  });
});

describe('queries compiled once', () => {
  const byLabel = reusableQuery(
    (handle: Db, label: string, minimum: number) =>
      handle
        .selectFrom('gadgets')
        .select(['id', sql<string>`upper(label)`.as('shout')])
        .where('label', '=', label)
        .where('id', '>=', minimum),
    2,
  );

  it('answers as the query built afresh does, for each call’s values', async () => {
    expect(await byLabel(db, 'stand', 1)).toEqual([{ id: 2, shout: 'STAND' }]);
    expect(await byLabel(db, 'lamp', 1)).toEqual([{ id: 1, shout: 'LAMP' }]);
    expect(await byLabel(db, 'lamp', 2)).toEqual([]);
  });

  it('refuses a query that does not bind every placeholder as a value', async () => {
    const unbound = reusableQuery(
      (handle: Db, _label: string) => handle.selectFrom('gadgets').select('id'),
      1,
    );
    await expect(unbound(db, 'lamp')).rejects.toThrow(/every placeholder/);
  });
});
