import http from 'node:http';
import type { AddressInfo } from 'node:net';
import { sql } from 'kysely';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { insertClient, insertPerson, insertStaff, TEST_PASSWORD } from '../factories/accounts';
import { uploadRoster } from '../factories/roster';
import { startTestApp, type TestApp } from '../setup/test-app';
import { linkTokenFrom, sendQueuedLinks, signedInAgent } from './helpers';

let t: TestApp;
let server: http.Server;
beforeAll(async () => {
  t = await startTestApp();
  server = http.createServer(t.app);
  await new Promise<void>((resolve) => server.listen(0, '127.0.0.1', resolve));
});
afterAll(async () => {
  await new Promise((resolve) => server.close(resolve));
  await t.close();
});

const file = 'First name,Last name,E-mail\r\nAda,Pike,ada@hp.example\r\nBo,Lund,bo@hp.example\r\n';

async function coordinators(count: number) {
  const client = await insertClient(t.db);
  const agents = [];
  for (let index = 0; index < count; index += 1) {
    const staff = await insertStaff(t.db, { role: 'coordinator', clientId: client.id });
    agents.push(await signedInAgent(t, staff.email));
  }
  return { client, agents };
}

/** Resolves once some request in this test's database holds an advisory lock. */
async function untilAdvisoryLockHeld() {
  for (;;) {
    const { rows } = await sql<{ n: number }>`
      select count(*)::int as n from pg_locks
      where locktype = 'advisory' and granted
        and database = (select oid from pg_database where datname = current_database())`.execute(
      t.db,
    );
    if ((rows[0]?.n ?? 0) > 0) return;
    await new Promise((resolve) => setTimeout(resolve, 20));
  }
}

describe('a second commit while the first is saving (issue 14, item 2)', () => {
  it('answers at once "being saved", and with the first result once it is done', async () => {
    const {
      client,
      agents: [agent],
    } = await coordinators(1);
    if (!agent) throw new Error('no agent');
    const draft = await uploadRoster(agent, client.id, file).expect(201);
    const commitPath = `/api/clients/${client.id}/roster/imports/${draft.body.id}/commit`;

    // Hold the client's row so the first commit stops inside its transaction, deterministically.
    let release = () => {};
    const released = new Promise<void>((resolve) => (release = resolve));
    let holding = () => {};
    const held = new Promise<void>((resolve) => (holding = resolve));
    const holder = t.db.transaction().execute(async (trx) => {
      await sql`select id from clients where id = ${client.id} for update`.execute(trx);
      holding();
      await released;
    });
    await held;
    const first = agent
      .post(commitPath)
      .send({ officeTimeZones: {} })
      .then((response) => response);
    await untilAdvisoryLockHeld();

    const second = await agent.post(commitPath).send({ officeTimeZones: {} });
    expect(second.status).toBe(409);
    expect(second.body.error).toMatchObject({
      code: 'import_being_saved',
      message: 'This import is being saved. Its result appears here when it is done.',
    });

    release();
    await holder;
    const saved = await first;
    expect(saved.status).toBe(201);
    expect(saved.body).toMatchObject({ added: 2 });
    const again = await agent.post(commitPath).send({ officeTimeZones: {} }).expect(200);
    expect(again.body).toEqual(saved.body);
    const people = await t.db
      .selectFrom('people')
      .select('email')
      .where('clientId', '=', client.id)
      .execute();
    expect(people).toHaveLength(2);
  });
});

describe('drafts per uploader (issue 14, item 12)', () => {
  it("a second person's upload leaves the first person's preview open; age expires drafts", async () => {
    const {
      client,
      agents: [first, second],
    } = await coordinators(2);
    if (!first || !second) throw new Error('no agents');
    const draftOfFirst = await uploadRoster(first, client.id, file).expect(201);
    const draftOfSecond = await uploadRoster(second, client.id, file).expect(201);
    const preview = (draftId: string) =>
      first.get(`/api/clients/${client.id}/roster/imports/${draftId}`);
    await preview(draftOfFirst.body.id).expect(200);
    await preview(draftOfSecond.body.id).expect(200);

    // The first person's new upload replaces only their own draft.
    const newer = await uploadRoster(first, client.id, file).expect(201);
    await preview(draftOfFirst.body.id).expect(404);
    await preview(draftOfSecond.body.id).expect(200);

    // An expired draft is gone for its owner and is removed by the next upload of anyone.
    await t.db
      .updateTable('rosterImportDrafts')
      .set({ expiresAt: new Date(Date.now() - 1000) })
      .where('id', '=', draftOfSecond.body.id)
      .execute();
    await preview(draftOfSecond.body.id).expect(404);
    await uploadRoster(first, client.id, file).expect(201);
    const left = await t.db
      .selectFrom('rosterImportDrafts')
      .select('id')
      .where('id', 'in', [draftOfSecond.body.id, newer.body.id])
      .execute();
    expect(left).toEqual([]);
  });
});

/** Sends the headers of a large body and only its first kilobyte: the rest never comes. */
function statusOfPartialUpload(clientId: string, cookie: string): Promise<number | undefined> {
  const { port } = server.address() as AddressInfo;
  return new Promise((resolve, reject) => {
    const outgoing = http.request(
      {
        host: '127.0.0.1',
        port,
        method: 'POST',
        path: `/api/clients/${clientId}/roster/imports?fileName=big.csv`,
        headers: {
          cookie,
          'content-type': 'application/octet-stream',
          'content-length': String(11 * 1024 * 1024),
        },
      },
      (response) => {
        resolve(response.statusCode);
        response.resume();
        outgoing.destroy();
      },
    );
    outgoing.on('error', reject);
    outgoing.write(Buffer.alloc(1024, 65));
  });
}

describe('who may upload is checked before the body is read (issue 14, item 11)', () => {
  it('a sitter and another client’s coordinator are refused without sending the whole body', async () => {
    const client = await insertClient(t.db);
    const person = await insertPerson(t.db, client.id);
    await request(t.app).post('/api/sign-in-links').send({ email: person.email }).expect(202);
    await sendQueuedLinks(t);
    const mail = await t.mail.waitFor(person.email);
    const redeemed = await request(t.app)
      .post('/api/sign-in-links/redeem')
      .send({ token: linkTokenFrom(mail.text, 'link') })
      .expect(201);
    const sitterCookie = String(redeemed.headers['set-cookie']?.[0] ?? '').split(';')[0] ?? '';
    expect(await statusOfPartialUpload(client.id, sitterCookie)).toBe(403);

    const other = await insertClient(t.db);
    const coordinator = await insertStaff(t.db, { role: 'coordinator', clientId: other.id });
    const signIn = await request(t.app)
      .post('/api/session')
      .send({ email: coordinator.email, password: TEST_PASSWORD })
      .expect(201);
    const cookie = String(signIn.headers['set-cookie']?.[0] ?? '').split(';')[0] ?? '';
    expect(await statusOfPartialUpload(client.id, cookie)).toBe(404);
  });
});

describe('bad shapes and characters over HTTP (issue 14, items 1 and 11)', () => {
  it('a NUL in a cell is removed with a warning on the row, and the import saves', async () => {
    const {
      client,
      agents: [agent],
    } = await coordinators(1);
    if (!agent) throw new Error('no agent');
    const withNul =
      'First name,Last name,E-mail,Shirt\r\nA\u0000da,Pike,ada@hp.example,L\u0000\r\n';
    // A NUL in the file name is not the file's content: the edge refuses it, naming the field.
    const refused = await uploadRoster(agent, client.id, withNul, 'staff\u0000.csv').expect(400);
    expect(JSON.stringify(refused.body.error)).toMatch(/fileName|control character/i);
    const draft = await uploadRoster(agent, client.id, withNul, 'staff.csv').expect(201);
    expect(draft.body.fileName).toBe('staff.csv');
    const rows = await agent
      .get(`/api/clients/${client.id}/roster/imports/${draft.body.id}/rows`)
      .expect(200);
    expect(rows.body.rows[0].values).toMatchObject({ givenName: 'Ada', extras: { Shirt: 'L' } });
    expect(Object.keys(rows.body.rows[0].warnings).sort()).toEqual(['Shirt', 'givenName']);
    await agent
      .post(`/api/clients/${client.id}/roster/imports/${draft.body.id}/commit`)
      .send({ officeTimeZones: {} })
      .expect(201);
    const saved = await t.db
      .selectFrom('people')
      .select(['givenName', 'extras'])
      .where('clientId', '=', client.id)
      .executeTakeFirstOrThrow();
    expect(saved).toEqual({ givenName: 'Ada', extras: { Shirt: 'L' } });
  });

  it('refuses 201 columns and a 5 MB cell with a clear 422 that does not echo the cell', async () => {
    const {
      client,
      agents: [agent],
    } = await coordinators(1);
    if (!agent) throw new Error('no agent');
    const wide = Array.from({ length: 201 }, (_, index) => `C${index}`).join(',');
    const columns = await uploadRoster(agent, client.id, `${wide}\r\n1\r\n`).expect(422);
    expect(columns.body.error.code).toBe('too_many_columns');
    const huge = `First name,Notes\r\nAda,${'x'.repeat(5 * 1024 * 1024)}\r\n`;
    const cell = await uploadRoster(agent, client.id, huge).expect(422);
    expect(cell.body.error.code).toBe('cell_too_long');
    expect(cell.text.length).toBeLessThan(1000);
  });
});
