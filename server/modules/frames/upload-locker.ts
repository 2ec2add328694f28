import { ERRORS, MemoryLocker, type Lock, type Locker, type RequestRelease } from '@tus/server';
import pg from 'pg';

// Advisory locks in two-key form: this class number keeps upload locks apart from the app's
// other advisory locks (matching, roster commits), which use the one-key form.
const UPLOAD_LOCK_CLASS = 7301;
const RETRY_MS = 100;

const sleep = (ms: number) => new Promise((resolve) => setTimeout(resolve, ms));

// pg-pool hears a connection's errors only while it is idle; a lock connection is checked out
// for as long as its upload writes. Cut then (a restart), its 'error' must not end the process:
// the lock went with the session, and unlock finds the connection gone.
const ignoreLost = () => undefined;

function releaseLockConnection(client: pg.PoolClient, destroy = false) {
  client.removeListener('error', ignoreLost);
  client.release(destroy);
}

/**
 * tus locks an upload while one request writes to it. Its own locker lives in one process's
 * memory; with several web processes a camera card resumed on another process must wait for
 * the first to let go. This one takes the process's memory lock first (so tus can still ask
 * a stale request in this process to release), then a PostgreSQL advisory lock held on a
 * connection of its own for as long as the request writes.
 */
export function createCrossProcessUploadLocker(
  databaseUrl: string,
  options: { acquireTimeoutMs?: number; maxConnections?: number } = {},
): Locker & { close(): Promise<void> } {
  const timeoutMs = options.acquireTimeoutMs ?? 30_000;
  const pool = new pg.Pool({ connectionString: databaseUrl, max: options.maxConnections ?? 16 });
  // A dropped lock connection only ends its upload request; it must not stop the process.
  pool.on('error', () => undefined);
  const memory = new MemoryLocker({ acquireLockTimeout: timeoutMs });

  return {
    newLock(id: string): Lock {
      const local = memory.newLock(id);
      let held: pg.PoolClient | null = null;
      return {
        async lock(signal: AbortSignal, requestRelease: RequestRelease) {
          const startedAt = Date.now();
          await local.lock(signal, requestRelease);
          const client = await pool.connect();
          client.on('error', ignoreLost);
          try {
            while (!signal.aborted && Date.now() - startedAt < timeoutMs) {
              const { rows } = await client.query<{ locked: boolean }>(
                'select pg_try_advisory_lock($1, hashtext($2)) as locked',
                [UPLOAD_LOCK_CLASS, id],
              );
              if (rows[0]?.locked) {
                held = client;
                return;
              }
              await sleep(RETRY_MS);
            }
          } catch (error) {
            releaseLockConnection(client, true);
            await local.unlock();
            throw error;
          }
          releaseLockConnection(client);
          await local.unlock();
          throw ERRORS.ERR_LOCK_TIMEOUT;
        },
        async unlock() {
          const client = held;
          held = null;
          try {
            if (client) {
              await client.query('select pg_advisory_unlock($1, hashtext($2))', [
                UPLOAD_LOCK_CLASS,
                id,
              ]);
              releaseLockConnection(client);
            }
          } catch {
            // The session is gone, and PostgreSQL released its lock with it.
            if (client) releaseLockConnection(client, true);
          } finally {
            await local.unlock();
          }
        },
      };
    },
    close: () => pool.end(),
  };
}
