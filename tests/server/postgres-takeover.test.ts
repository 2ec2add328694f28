import { spawn } from 'node:child_process';
import { chmodSync, existsSync, mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import pg from 'pg';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import {
  freePort,
  ownerFileOf,
  startCluster,
  type RunningCluster,
} from '../../scripts/lib/postgres-cluster';

// `npm start` killed with kill -9 leaves PostgreSQL running. The next start must either take
// the server over (and stop it on exit) or say plainly that another live process runs it.

let folder: string;
let dataFolder: string;
let first: RunningCluster;

beforeAll(async () => {
  folder = mkdtempSync(path.join(os.tmpdir(), 'likeness-takeover-pg-'));
  chmodSync(folder, 0o755);
  dataFolder = path.join(folder, 'data');
  first = await startCluster({ dataFolder, port: await freePort(), disposable: true });
});

afterAll(async () => {
  first.stop();
  // Whatever a failed test left running is taken over here and stopped.
  if (serverRunning()) (await startCluster({ dataFolder, port: await freePort() })).stop();
  rmSync(folder, { recursive: true, force: true });
});

const serverRunning = () => existsSync(path.join(dataFolder, 'postmaster.pid'));

async function answers(cluster: RunningCluster) {
  const client = new pg.Client({ connectionString: cluster.urlFor('postgres') });
  await client.connect();
  const result = await client.query('select 1 as one');
  await client.end();
  return result.rows[0] as { one: number };
}

describe('a cluster left running by an earlier start', () => {
  it('is left alone, and said to be, while the process that started it is alive', async () => {
    const other = spawn('sleep', ['60']);
    try {
      writeFileSync(ownerFileOf(dataFolder), JSON.stringify({ pid: other.pid }));
      const lines: string[] = [];
      const second = await startCluster({
        dataFolder,
        port: await freePort(),
        log: (line) => lines.push(line),
      });
      expect(second.startedHere).toBe(false);
      expect(second.ownedBy).toBe(other.pid);
      expect(lines.join('\n')).toMatch(
        new RegExp(`already running .*another Likeness process \\(pid ${other.pid}\\)`, 's'),
      );
      expect(await answers(second)).toEqual({ one: 1 });
      second.stop();
      expect(serverRunning()).toBe(true);
    } finally {
      other.kill();
    }
  });

  it('is taken over when its starter was killed, and stopped on exit', async () => {
    // The server of the first test stops; a stand-in for `npm start` starts it and is killed.
    first.stop();
    expect(serverRunning()).toBe(false);
    const port = await freePort();
    const starter = spawn(
      process.execPath,
      [
        '--import',
        'tsx',
        path.join(import.meta.dirname, '../support/start-cluster-and-wait.ts'),
        dataFolder,
        String(port),
      ],
      { stdio: ['ignore', 'pipe', 'inherit'] },
    );
    await new Promise<void>((resolve, reject) => {
      starter.stdout.on('data', (chunk: Buffer) => {
        if (chunk.toString().includes('started')) resolve();
      });
      starter.once('exit', (code) => reject(new Error(`the starter exited with ${code}`)));
    });
    const killed = new Promise((resolve) => starter.once('exit', resolve));
    starter.kill('SIGKILL');
    await killed;
    expect(serverRunning()).toBe(true);

    const lines: string[] = [];
    const second = await startCluster({
      dataFolder,
      port: await freePort(),
      log: (line) => lines.push(line),
    });
    expect(second.startedHere).toBe(true);
    expect(second.takenOver).toBe(true);
    expect(lines.join('\n')).toMatch(/left running .* taking it over/s);
    // It connects on the port the running server reports, not the one asked for.
    expect(second.port).toBe(port);
    expect(await answers(second)).toEqual({ one: 1 });
    second.stop();
    expect(serverRunning()).toBe(false);
    expect(existsSync(ownerFileOf(dataFolder))).toBe(false);
  });
});
