import { sql } from 'kysely';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { insertClient, insertPerson } from '../factories/accounts';
import { createTestDatabase, type TestDatabase } from '../setup/test-database';

// People keep one index on e-mail: unique per client, keyed by lower(email) first so that the
// sign-in lookup by e-mail alone reads it too. PostgreSQL documentation, "Multicolumn
// Indexes" (11.3): a multicolumn B-tree index is used for conditions on its leading column.

let database: TestDatabase;
beforeAll(async () => {
  database = await createTestDatabase();
});
afterAll(() => database.drop());

describe("people's e-mail index", () => {
  it('refuses the same address in another case for one client, allows it for another client', async () => {
    const { db } = database;
    const first = await insertClient(db);
    const second = await insertClient(db);
    await insertPerson(db, first.id, { email: 'robin.vale@client.example' });
    await expect(
      insertPerson(db, first.id, { email: 'Robin.Vale@Client.example' }),
    ).rejects.toMatchObject({ code: '23505', constraint: 'people_client_email_unique' });
    await expect(
      insertPerson(db, second.id, { email: 'Robin.Vale@Client.example' }),
    ).resolves.toBeDefined();
  });

  it('serves the sign-in lookup by e-mail across clients', async () => {
    const { db } = database;
    const client = await insertClient(db);
    for (let index = 0; index < 50; index += 1) await insertPerson(db, client.id);
    await sql`analyze people`.execute(db);
    const plan = await db.connection().execute(async (connection) => {
      // A few dozen rows would be read whole otherwise; the question is which index fits.
      await sql`set enable_seqscan = off`.execute(connection);
      const query = connection
        .selectFrom('people')
        .select('id')
        .where((eb) => eb(eb.fn('lower', ['email']), '=', 'robin.vale@client.example'))
        .compile();
      const explained = await sql<{ 'QUERY PLAN': string }>`explain ${sql.raw(
        query.sql.replace('$1', "'robin.vale@client.example'"),
      )}`.execute(connection);
      await sql`reset enable_seqscan`.execute(connection);
      return explained.rows.map((row) => row['QUERY PLAN']).join('\n');
    });
    expect(plan).toMatch(
      /Index (Only )?Scan using people_client_email_unique|Bitmap Index Scan on people_client_email_unique/,
    );
    const indexes = await sql<{ indexname: string }>`
      select indexname from pg_indexes where tablename = 'people' and indexdef ilike '%lower(email)%'`.execute(
      db,
    );
    expect(indexes.rows.map((row) => row.indexname)).toEqual(['people_client_email_unique']);
  });
});
