import type { PostgresPool, PostgresPoolClient } from 'kysely';
import type pg from 'pg';
import { CopyPayload, runCopy } from './copy-rows';

/**
 * Kysely's view of a pg pool in which the statements a process runs again and again become
 * named (prepared) statements. PostgreSQL then plans each once per connection, and after a few
 * runs keeps a generic plan, instead of planning it anew on every call: for the short queries
 * of a request (the session, a day, a claim) planning was most of their database time.
 *
 * Only statement texts seen `after` times are named (a one-off report is not worth a plan kept
 * per connection), at most `maxNames` of them per process, and only plain SELECT / INSERT /
 * UPDATE / DELETE / WITH statements (transaction control and DDL run as they are). A query
 * whose one value is a CopyPayload runs as COPY … FROM STDIN on the same connection
 * (copy-rows.ts), with or without preparing.
 */
export function preparingPool(
  pool: pg.Pool,
  options: { after?: number; maxNames?: number; prepare?: boolean } = {},
): PostgresPool {
  const after = options.after ?? 3;
  // Without preparing (behind a pooler), the wrapper still runs COPY (copy-rows.ts).
  const maxNames = options.prepare === false ? 0 : (options.maxNames ?? 1000);
  const seen = new Map<string, number>();
  const names = new Map<string, string>();
  let counter = 0;

  function nameFor(text: string): string | undefined {
    const known = names.get(text);
    if (known) return known;
    if (names.size >= maxNames || !/^\s*(select|insert|update|delete|with)\b/i.test(text)) {
      return undefined;
    }
    const count = (seen.get(text) ?? 0) + 1;
    if (count < after) {
      // Texts that never repeat (long IN lists, say) must not fill the memory either.
      if (seen.size > 10 * maxNames) seen.clear();
      seen.set(text, count);
      return undefined;
    }
    seen.delete(text);
    counter += 1;
    const name = `likeness_q${counter}`;
    names.set(text, name);
    return name;
  }

  function wrap(client: pg.PoolClient): PostgresPoolClient {
    // pg-pool listens for a connection's errors only while it is idle. Cut while checked out
    // between two statements of a transaction (a restart, an outage), the connection would
    // raise an 'error' nobody hears and end the process; heard here, the next statement fails
    // instead ("Client has encountered a connection error"), which answers 503.
    const lost = (error: Error) => {
      process.emitWarning(`PostgreSQL connection lost while in use: ${error.message}`);
    };
    client.on('error', lost);
    async function run(text: string, values: ReadonlyArray<unknown>) {
      if (values.length === 1 && values[0] instanceof CopyPayload)
        return runCopy(client, values[0]);
      const name = nameFor(text);
      if (!name) return client.query(text, values as unknown[]);
      try {
        return await client.query({ name, text, values: values as unknown[] });
      } catch (error) {
        // A migration changed a table under a prepared `select *`: PostgreSQL refuses the old
        // statement's result shape. Forget the name (every connection prepares anew) and run
        // the text once more unnamed; inside a transaction the retry fails as the first did.
        if (!changedResultType(error)) throw error;
        names.delete(text);
        return client.query(text, values as unknown[]);
      }
    }
    return {
      query: ((text: unknown, values?: ReadonlyArray<unknown>) =>
        typeof text === 'string'
          ? run(text, values ?? [])
          : client.query(text as never)) as unknown as PostgresPoolClient['query'],
      release: (destroy?: boolean) => {
        client.removeListener('error', lost);
        client.release(destroy);
      },
    };
  }

  return {
    connect: async () => wrap(await pool.connect()),
    end: () => pool.end(),
  };
}

function changedResultType(error: unknown): boolean {
  const { code, message } = (error ?? {}) as { code?: unknown; message?: unknown };
  return code === '0A000' && typeof message === 'string' && message.includes('result type');
}
