import { spawn, type ChildProcessWithoutNullStreams } from 'node:child_process';
import { mkdtempSync, rmSync } from 'node:fs';
import net from 'node:net';
import os from 'node:os';
import path from 'node:path';
import { sql } from 'kysely';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { freePort } from '../../scripts/lib/postgres-cluster';
import { MATCH_DAY_TASK } from '../../server/modules/matching/matching-run';
import { createTestDatabase, type TestDatabase } from '../setup/test-database';

// PROCESS_ROLE=worker: the start script runs graphile-worker's jobs and no web server.

let database: TestDatabase;
let scratch: string;
let child: ChildProcessWithoutNullStreams | undefined;

beforeAll(async () => {
  database = await createTestDatabase();
  scratch = mkdtempSync(path.join(os.tmpdir(), 'likeness-roles-'));
});

afterAll(async () => {
  child?.kill('SIGKILL');
  await database.drop();
  rmSync(scratch, { recursive: true, force: true });
});

const refused = (port: number) =>
  new Promise<boolean>((resolve) => {
    const socket = net.connect(port, '127.0.0.1');
    socket.once('connect', () => {
      socket.destroy();
      resolve(false);
    });
    socket.once('error', () => resolve(true));
  });

describe('a worker process', () => {
  it('runs jobs, serves no HTTP, and stops cleanly', async () => {
    const port = await freePort();
    const root = path.resolve(import.meta.dirname, '../..');
    const started = spawn(process.execPath, ['--import', 'tsx', 'scripts/start.ts'], {
      cwd: root,
      env: {
        ...process.env,
        PROCESS_ROLE: 'worker',
        DATABASE_URL: database.url,
        LOAD_DEMO: 'false',
        MAIL_CATCHER_PORT: '0',
        PORT: String(port),
        LIKENESS_DATA_DIR: scratch,
        LOG_LEVEL: 'silent',
      },
    });
    child = started;
    let output = '';
    started.stdout.on('data', (chunk: Buffer) => (output += chunk.toString()));
    started.stderr.on('data', (chunk: Buffer) => (output += chunk.toString()));
    await expect.poll(() => output, { timeout: 30_000 }).toMatch(/Press Ctrl-C to stop/);
    expect(output).toMatch(/Running as a worker: background jobs only/);
    expect(await refused(port)).toBe(true);

    // A job only a running worker takes (its payload is refused): its failed attempt stays.
    await sql`select graphile_worker.add_job(${MATCH_DAY_TASK}, '{}'::json, max_attempts => 1)`.execute(
      database.db,
    );
    await expect
      .poll(
        async () =>
          (
            await sql<{ attempts: number; lastError: string | null }>`
              select attempts, last_error from graphile_worker.jobs
               where task_identifier = ${MATCH_DAY_TASK}`.execute(database.db)
          ).rows[0],
        { timeout: 15_000 },
      )
      .toMatchObject({ attempts: 1, lastError: expect.any(String) });

    const exited = new Promise<number | null>((resolve) => started.once('exit', resolve));
    started.kill('SIGINT');
    expect(await exited).toBe(0);
    expect(output).toMatch(/stopped cleanly/);
  });
});
