import { sql, type Kysely } from 'kysely';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { copyRows, copyText } from '../../server/db/copy-rows';
import { createDatabase, type Db } from '../../server/db/database';
import { createTestDatabase, type TestDatabase } from '../setup/test-database';

// COPY … FROM STDIN through the pool's client wrapper. PostgreSQL itself is the outside check:
// what it reads back from our text format must be the values we meant ("COPY", File Formats,
// Text Format, in the PostgreSQL documentation: backslash escapes, \N for NULL).

let database: TestDatabase;
type Tables = { notes: { id: number; body: string | null; tally: number | null } };

const awkward = [
  'tab\there',
  'line\nbreak',
  'carriage\rreturn',
  'back\\slash',
  '\\N',
  'ends with backslash\\',
  'Æsa Ørnbjerg — “quoted”',
  '',
];

beforeAll(async () => {
  database = await createTestDatabase();
});
afterAll(async () => {
  await database.drop();
});

describe.each([true, false])('copyRows, statements prepared: %s', (prepareStatements) => {
  let db: Kysely<Tables>;
  beforeAll(async () => {
    db = createDatabase(database.url, { maxConnections: 2, prepareStatements }) as never;
    await sql`create table if not exists notes (id int primary key, body text, tally int)`.execute(
      db,
    );
  });
  afterAll(async () => {
    await db.destroy();
  });

  it('writes every value as PostgreSQL reads it back, nulls included', async () => {
    await sql`truncate notes`.execute(db);
    const rows = awkward.map((body, index) => [index, body, index % 2 === 0 ? null : index * 7]);
    rows.push([awkward.length, null, null]);
    await copyRows(db as unknown as Db, 'notes', ['id', 'body', 'tally'], rows);
    const back = await db.selectFrom('notes').selectAll().orderBy('id').execute();
    expect(back).toEqual(rows.map(([id, body, tally]) => ({ id, body, tally })));
  });

  it('sends many rows in chunks, each built from its row when due, all in order', async () => {
    await sql`truncate notes`.execute(db);
    const ids = Array.from({ length: 4_501 }, (_, index) => index);
    await copyRows(db as unknown as Db, 'notes', ['id', 'body'], ids, (id) => [id, `note ${id}`]);
    const back = await db.selectFrom('notes').select(['id', 'body']).orderBy('id').execute();
    expect(back).toEqual(ids.map((id) => ({ id, body: `note ${id}` })));
  });

  it('takes a generator, read once as the COPY goes; one that yields nothing writes nothing', async () => {
    await sql`truncate notes`.execute(db);
    let taken = 0;
    function* notes(count: number) {
      for (let id = 0; id < count; id += 1) {
        taken += 1;
        yield id;
      }
    }
    await copyRows(db as unknown as Db, 'notes', ['id', 'body'], notes(2_500), (id) => [id, 'g']);
    expect(taken).toBe(2_500);
    expect(await db.selectFrom('notes').select('id').execute()).toHaveLength(2_500);
    await sql`truncate notes`.execute(db);
    await copyRows(db as unknown as Db, 'notes', ['id', 'body'], notes(0), (id) => [id, 'g']);
    expect(await db.selectFrom('notes').select('id').execute()).toEqual([]);
  });

  it('a row refused in a later chunk writes none of the earlier ones', async () => {
    await sql`truncate notes`.execute(db);
    const ids = Array.from({ length: 4_501 }, (_, index) => index);
    await expect(
      copyRows(db as unknown as Db, 'notes', ['id', 'body'], ids, (id) => [
        id === 4_500 ? 0 : id,
        'x',
      ]),
    ).rejects.toThrow(/duplicate key/);
    expect(await db.selectFrom('notes').select('id').execute()).toEqual([]);
  });

  it('a row that cannot be encoded stops the COPY with its error, and the connection goes on', async () => {
    await sql`truncate notes`.execute(db);
    const ids = Array.from({ length: 4_501 }, (_, index) => index);
    await expect(
      copyRows(db as unknown as Db, 'notes', ['id', 'body'], ids, (id) => {
        if (id === 3_000) throw new Error('row 3000 cannot be encoded');
        return [id, 'x'];
      }),
    ).rejects.toThrow(/row 3000 cannot be encoded/);
    expect(await db.selectFrom('notes').select('id').execute()).toEqual([]);
    await copyRows(db as unknown as Db, 'notes', ['id', 'body'], [[2, 'two']]);
    expect(await db.selectFrom('notes').select('id').execute()).toEqual([{ id: 2 }]);
  });

  it('belongs to the transaction it runs in: a later failure leaves nothing', async () => {
    await sql`truncate notes`.execute(db);
    await expect(
      db.transaction().execute(async (trx) => {
        await copyRows(trx as unknown as Db, 'notes', ['id', 'body'], [[1, 'kept?']]);
        expect(await trx.selectFrom('notes').select('id').execute()).toEqual([{ id: 1 }]);
        await sql`select 1 / 0`.execute(trx);
      }),
    ).rejects.toThrow(/division by zero/);
    expect(await db.selectFrom('notes').select('id').execute()).toEqual([]);
  });

  it('a row PostgreSQL refuses fails the whole COPY and the connection stays usable', async () => {
    await sql`truncate notes`.execute(db);
    await expect(
      copyRows(
        db as unknown as Db,
        'notes',
        ['id', 'body'],
        [
          [1, 'one'],
          [1, 'the same id again'],
        ],
      ),
    ).rejects.toThrow(/duplicate key/);
    expect(await db.selectFrom('notes').select('id').execute()).toEqual([]);
    await copyRows(db as unknown as Db, 'notes', ['id', 'body'], [[2, 'two']]);
    expect(await db.selectFrom('notes').select('id').execute()).toEqual([{ id: 2 }]);
  });
});

describe('copyText', () => {
  it('escapes backslash, tab, line feed and carriage return, and writes NULL as \\N', () => {
    expect(copyText([['a\tb', null, 3, 'c\\d\ne\rf']])).toBe('a\\tb\t\\N\t3\tc\\\\d\\ne\\rf\n');
    expect(copyText([])).toBe('');
  });

  it('refuses a table or column name that is not a plain SQL name', async () => {
    await expect(copyRows({} as Db, 'notes; drop table notes', ['id'], [[1]])).rejects.toThrow(
      /plain SQL name/,
    );
  });
});
