import type { Compilable, CompiledQuery, Kysely } from 'kysely';

/**
 * A query Kysely builds and compiles once per database handle, then runs with each call's
 * values. Kysely otherwise builds the operation tree, runs the plugins over it and prints the
 * SQL on every call: for the few queries every request runs (the session behind the cookie,
 * the day a booking is for) that cost more than PostgreSQL's own work once the statement is
 * prepared (prepared-statements.ts).
 *
 * `build` gets one placeholder per argument and must use each only as a plain bound value
 * (`where id = placeholder`, `${placeholder}` in a sql template): never in an IN list, never
 * in a way that changes the SQL text by its value. The results still go through the plugins.
 */
export function reusableQuery<DB, Args extends unknown[], Row>(
  build: (db: Kysely<DB>, ...placeholders: Args) => Compilable<Row>,
  arity: Args['length'],
) {
  const compiled = new WeakMap<object, CompiledQuery<Row>>();
  const placeholders = Array.from(
    { length: arity },
    (_, index) => ({ placeholder: index }) as const,
  );

  function compiledFor(db: Kysely<DB>): CompiledQuery<Row> {
    let query = compiled.get(db);
    if (!query) {
      query = build(db, ...(placeholders as unknown as Args)).compile();
      const used = new Set(
        query.parameters.filter((value) => placeholders.includes(value as never)),
      );
      if (used.size !== arity) throw new Error('reusableQuery: every placeholder must be bound');
      compiled.set(db, query);
    }
    return query;
  }

  return async function run(db: Kysely<DB>, ...args: Args): Promise<Row[]> {
    const query = compiledFor(db);
    const parameters = query.parameters.map((value) => {
      const index = placeholders.indexOf(value as never);
      return index === -1 ? value : args[index];
    });
    const result = await db.executeQuery<Row>({ ...query, parameters });
    return result.rows;
  };
}
