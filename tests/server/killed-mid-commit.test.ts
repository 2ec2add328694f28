import { spawn, type ChildProcessWithoutNullStreams } from 'node:child_process';
import { mkdtempSync, rmSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import pg from 'pg';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { insertClient, insertStaff, TEST_PASSWORD } from '../factories/accounts';
import { demoRosterCsv, uploadRoster } from '../factories/roster';
import { createTestDatabase, type TestDatabase } from '../setup/test-database';

// The server process is killed (SIGKILL, as a power cut or the OOM killer would) while a
// roster commit is inside its transaction: PostgreSQL must roll it all back, so nothing of the
// import is left half written and the same draft can be committed afterwards.

let database: TestDatabase;
let scratch: string;
let child: ChildProcessWithoutNullStreams | undefined;

beforeAll(async () => {
  database = await createTestDatabase();
  scratch = mkdtempSync(path.join(os.tmpdir(), 'likeness-killed-'));
});

afterAll(async () => {
  child?.kill('SIGKILL');
  await database.drop();
  rmSync(scratch, { recursive: true, force: true });
});

async function startServer(): Promise<string> {
  const started = spawn(
    process.execPath,
    [
      '--import',
      'tsx',
      path.join(import.meta.dirname, '../support/serve-app.ts'),
      database.url,
      scratch,
    ],
    { stdio: ['pipe', 'pipe', 'pipe'] },
  );
  child = started;
  const port = await new Promise<string>((resolve, reject) => {
    started.stdout.on('data', (chunk: Buffer) => {
      const match = /port (\d+)/.exec(chunk.toString());
      if (match?.[1]) resolve(match[1]);
    });
    started.once('exit', (code) => reject(new Error(`the server exited with ${code}`)));
  });
  return `http://127.0.0.1:${port}`;
}

const roster = demoRosterCsv([
  ['Ines', 'Carvalho', 'ines.carvalho@hp.example', 'HP-001', 'Porto'],
  ['Tom', 'Ashby', 'tom.ashby@hp.example', 'HP-002', 'Leeds'],
]);
const zones = { Porto: 'Europe/Lisbon', Leeds: 'Europe/London' };

async function countsFor(clientId: string) {
  const count = async (table: 'people' | 'offices' | 'rosterImports' | 'rosterImportDrafts') =>
    Number(
      (
        await database.db
          .selectFrom(table)
          .select((eb) => eb.fn.countAll().as('n'))
          .where('clientId', '=', clientId)
          .executeTakeFirstOrThrow()
      ).n,
    );
  return {
    people: await count('people'),
    offices: await count('offices'),
    imports: await count('rosterImports'),
    drafts: await count('rosterImportDrafts'),
  };
}

describe('the server killed mid-commit', () => {
  it('leaves nothing half written, and the draft commits afterwards', async () => {
    const client = await insertClient(database.db);
    const admin = await insertStaff(database.db, { role: 'studio_admin' });
    let baseUrl = await startServer();
    let agent = request.agent(baseUrl);
    await agent
      .post('/api/session')
      .send({ email: admin.email, password: TEST_PASSWORD })
      .expect(201);
    const draft = await uploadRoster(agent, client.id, roster).expect(201);
    const before = await countsFor(client.id);
    expect(before).toEqual({ people: 0, offices: 0, imports: 0, drafts: 1 });

    // Hold the audit table: the commit writes people, offices and the import record, then
    // waits on its audit row, the last statement of its transaction.
    const blocker = new pg.Client({ connectionString: database.url });
    blocker.on('error', () => undefined);
    await blocker.connect();
    await blocker.query('begin');
    await blocker.query('lock table audit_events in share mode');
    const commit = agent
      .post(`/api/clients/${client.id}/roster/imports/${draft.body.id}/commit`)
      .send({ officeTimeZones: zones })
      .then(
        (response) => `answered ${response.status} ${JSON.stringify(response.body)}`,
        () => 'cut off',
      );
    await expect
      .poll(async () => {
        const waiting = await blocker.query(
          `select count(*)::int as n from pg_locks
            where not granted and relation = 'audit_events'::regclass`,
        );
        return (waiting.rows[0] as { n: number }).n;
      })
      .toBe(1);
    const exited = new Promise((resolve) => child!.once('exit', resolve));
    child!.kill('SIGKILL');
    await exited;
    expect(await commit).toBe('cut off');
    await blocker.query('rollback');
    // PostgreSQL ends the dead client's session when it notices; until then its locks stand.
    await expect
      .poll(async () => {
        const open = await blocker.query(
          `select count(*)::int as n from pg_stat_activity
            where datname = current_database() and pid <> pg_backend_pid()
              and state like 'idle in transaction%'`,
        );
        return (open.rows[0] as { n: number }).n;
      })
      .toBe(0);
    await blocker.end();

    expect(await countsFor(client.id)).toEqual(before);

    baseUrl = await startServer();
    agent = request.agent(baseUrl);
    await agent
      .post('/api/session')
      .send({ email: admin.email, password: TEST_PASSWORD })
      .expect(201);
    await agent
      .post(`/api/clients/${client.id}/roster/imports/${draft.body.id}/commit`)
      .send({ officeTimeZones: zones })
      .expect(201);
    expect(await countsFor(client.id)).toEqual({ people: 2, offices: 2, imports: 1, drafts: 0 });
  });
});
