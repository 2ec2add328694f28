import { sql } from 'kysely';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { insertClient, insertOffice, insertPerson, insertStaff } from '../factories/accounts';
import { demoRosterCsv, uploadRoster } from '../factories/roster';
import { startTestApp, type TestApp } from '../setup/test-app';
import { signedInAgent } from './helpers';

let t: TestApp;
beforeAll(async () => {
  t = await startTestApp();
});
afterAll(() => t.close());

async function coordinatorOfNewClient() {
  const client = await insertClient(t.db);
  const coordinator = await insertStaff(t.db, { role: 'coordinator', clientId: client.id });
  return { client, agent: await signedInAgent(t, coordinator.email) };
}

async function rosterOf(clientId: string) {
  return t.db
    .selectFrom('people')
    .leftJoin('offices', 'offices.id', 'people.officeId')
    .select([
      'people.givenName',
      'people.familyName',
      'people.email',
      'people.employeeId',
      'people.active',
      'offices.name as office',
    ])
    .where('people.clientId', '=', clientId)
    .orderBy('people.email')
    .execute();
}

const firstFile = demoRosterCsv([
  ['Ines', 'Carvalho', 'ines.carvalho@hp.example', 'HP-001', 'Porto'],
  ['Tom', 'Ashby', 'TOM.ASHBY@hp.example ', 'HP-002', 'Leeds'],
  ['Sanne', 'de Vries', 'sanne.devries@hp.example', 'HP-003', 'Rotterdam'],
]);
const zones = { Porto: 'Europe/Lisbon', Leeds: 'Europe/London', Rotterdam: 'Europe/Amsterdam' };

describe('roster import', () => {
  it('previews without writing anything to the roster', async () => {
    const { client, agent } = await coordinatorOfNewClient();
    const draft = await uploadRoster(agent, client.id, firstFile).expect(201);
    expect(draft.body.mappingRemembered).toBe(false);
    expect(draft.body.mapping).toEqual([
      'givenName',
      'familyName',
      'email',
      'employeeId',
      'office',
    ]);
    expect(draft.body.counts).toEqual({
      add: 3,
      update: 0,
      conflict: 0,
      unchanged: 0,
      error: 0,
      missing: 0,
    });
    expect(draft.body.newOffices).toEqual(['Leeds', 'Porto', 'Rotterdam']);
    const rows = await agent
      .get(`/api/clients/${client.id}/roster/imports/${draft.body.id}/rows?kind=add&sort=email`)
      .expect(200);
    expect(rows.body.total).toBe(3);
    expect(rows.body.rows[0].values.email).toBe('ines.carvalho@hp.example');
    // The preview's search reads what the directory's does: the employee id, the full name.
    const byId = await agent
      .get(`/api/clients/${client.id}/roster/imports/${draft.body.id}/rows?q=hp-002`)
      .expect(200);
    expect(byId.body.rows.map((row: { values: { email: string } }) => row.values.email)).toEqual([
      'tom.ashby@hp.example',
    ]);
    const byFullName = await agent
      .get(`/api/clients/${client.id}/roster/imports/${draft.body.id}/rows?q=Sanne%20de%20V`)
      .expect(200);
    expect(byFullName.body.total).toBe(1);
    expect(await rosterOf(client.id)).toEqual([]);
    const offices = await t.db
      .selectFrom('offices')
      .select('id')
      .where('clientId', '=', client.id)
      .execute();
    expect(offices).toEqual([]);
  });

  it('commits adds, then a re-import updates by employee id or e-mail and deactivates the missing', async () => {
    const { client, agent } = await coordinatorOfNewClient();
    const first = await uploadRoster(agent, client.id, firstFile).expect(201);
    const committed = await agent
      .post(`/api/clients/${client.id}/roster/imports/${first.body.id}/commit`)
      .send({ officeTimeZones: zones })
      .expect(201);
    expect(committed.body).toMatchObject({ added: 3, officesCreated: 3, fileName: 'staff.csv' });
    expect((await rosterOf(client.id)).map((p) => p.email)).toEqual([
      'ines.carvalho@hp.example',
      'sanne.devries@hp.example',
      'tom.ashby@hp.example',
    ]);

    // Ines changes e-mail (same id), Tom loses his id column value but keeps his e-mail,
    // Sanne is gone, Priya is new.
    const second = demoRosterCsv([
      ['Ines', 'Carvalho', 'ines.c@hp.example', 'HP-001', 'Porto'],
      ['Tom', 'Ashby-Reed', 'tom.ashby@HP.example', 'HP-002', 'Leeds'],
      ['Priya', 'Nair', 'priya.nair@hp.example', 'HP-004', 'Leeds'],
    ]);
    const draft = await uploadRoster(agent, client.id, second, 'staff-2.csv').expect(201);
    expect(draft.body.mappingRemembered).toBe(true);
    expect(draft.body.counts).toEqual({
      add: 1,
      update: 2,
      conflict: 0,
      unchanged: 0,
      error: 0,
      missing: 1,
    });
    const updates = await agent
      .get(`/api/clients/${client.id}/roster/imports/${draft.body.id}/rows?kind=update`)
      .expect(200);
    expect(updates.body.rows.map((row: { changedFields: string[] }) => row.changedFields)).toEqual([
      ['email'],
      ['familyName'],
    ]);
    await agent
      .post(`/api/clients/${client.id}/roster/imports/${draft.body.id}/commit`)
      .send({ officeTimeZones: {}, deactivateMissing: true })
      .expect(201);
    const roster = await rosterOf(client.id);
    expect(roster).toHaveLength(4);
    expect(roster.find((p) => p.employeeId === 'HP-001')?.email).toBe('ines.c@hp.example');
    expect(roster.find((p) => p.employeeId === 'HP-002')?.familyName).toBe('Ashby-Reed');
    expect(roster.find((p) => p.employeeId === 'HP-003')?.active).toBe(false);
    expect(roster.find((p) => p.employeeId === 'HP-004')?.office).toBe('Leeds');

    const history = await agent.get(`/api/clients/${client.id}/roster/history`).expect(200);
    expect(history.body.imports[0]).toMatchObject({
      fileName: 'staff-2.csv',
      added: 1,
      updated: 2,
      deactivated: 1,
    });
    // The mapping is remembered: the next upload of the same headers needs no changes.
    const saved = await t.db
      .selectFrom('rosterMappings')
      .select('mapping')
      .where('clientId', '=', client.id)
      .executeTakeFirstOrThrow();
    expect(saved.mapping['emp number']).toBe('employeeId');
  });

  it('is all or nothing: one failing insert leaves no rows, offices or history', async () => {
    const { client, agent } = await coordinatorOfNewClient();
    // A constraint only this test has makes the database refuse one row of the batch.
    await sql`alter table people add constraint test_refuses_one check (given_name <> 'Refused')`.execute(
      t.db,
    );
    try {
      const file = demoRosterCsv([
        ['Ines', 'Carvalho', 'ines@hp.example', 'HP-1', 'Porto'],
        ['Refused', 'Row', 'refused@hp.example', 'HP-2', 'Porto'],
      ]);
      const draft = await uploadRoster(agent, client.id, file).expect(201);
      const response = await agent
        .post(`/api/clients/${client.id}/roster/imports/${draft.body.id}/commit`)
        .send({ officeTimeZones: zones });
      expect(response.status).toBe(500);
    } finally {
      await sql`alter table people drop constraint test_refuses_one`.execute(t.db);
    }
    expect(await rosterOf(client.id)).toEqual([]);
    expect(
      await t.db.selectFrom('offices').select('id').where('clientId', '=', client.id).execute(),
    ).toEqual([]);
    expect(
      await t.db
        .selectFrom('rosterImports')
        .select('id')
        .where('clientId', '=', client.id)
        .execute(),
    ).toEqual([]);
  });

  it('asks for a time zone for each new office before writing', async () => {
    const { client, agent } = await coordinatorOfNewClient();
    const draft = await uploadRoster(agent, client.id, firstFile).expect(201);
    const response = await agent
      .post(`/api/clients/${client.id}/roster/imports/${draft.body.id}/commit`)
      .send({ officeTimeZones: { Porto: 'Europe/Lisbon' } })
      .expect(400);
    expect(Object.keys(response.body.error.details.fieldErrors).sort()).toEqual([
      'office:Leeds',
      'office:Rotterdam',
    ]);
    expect(await rosterOf(client.id)).toEqual([]);
  });

  it('refuses to commit when the roster changed after the preview', async () => {
    const { client, agent } = await coordinatorOfNewClient();
    const draft = await uploadRoster(agent, client.id, firstFile).expect(201);
    await insertPerson(t.db, client.id);
    const response = await agent
      .post(`/api/clients/${client.id}/roster/imports/${draft.body.id}/commit`)
      .send({ officeTimeZones: zones })
      .expect(409);
    expect(response.body.error.code).toBe('roster_changed');

    // Checking the same file and columns again compares it with the roster as it is now.
    const imports = `/api/clients/${client.id}/roster/imports/${draft.body.id}`;
    await agent.put(`${imports}/mapping`).send({ mapping: draft.body.mapping }).expect(200);
    await agent.post(`${imports}/commit`).send({ officeTimeZones: zones }).expect(201);
    expect((await rosterOf(client.id)).length).toBe(draft.body.counts.add + 1);
  });

  it('reports rows in error per cell and offers them as CSV', async () => {
    const { client, agent } = await coordinatorOfNewClient();
    const file =
      'First name;Last name;E-mail\r\n;Ashby;tom@hp.example\r\nAda;Pike;not-an-address\r\nBo;Lund;bo@hp.example\r\nBo;Lund;BO@hp.example\r\n';
    const draft = await uploadRoster(agent, client.id, file).expect(201);
    expect(draft.body.delimiter).toBe(';');
    expect(draft.body.counts).toMatchObject({ add: 1, error: 3 });
    const errors = await agent
      .get(`/api/clients/${client.id}/roster/imports/${draft.body.id}/rows?kind=error`)
      .expect(200);
    expect(errors.body.rows.map((row: { errors: object }) => Object.keys(row.errors))).toEqual([
      ['givenName'],
      ['email'],
      ['email'],
    ]);
    const csv = await agent
      .get(`/api/clients/${client.id}/roster/imports/${draft.body.id}/errors.csv`)
      .expect(200)
      .expect('Content-Type', 'text/csv; charset=utf-8');
    // The upload was ";"-separated UTF-8 without a byte order mark: so is the file to fix.
    expect(csv.text.split('\r\n')[0]).toBe('First name;Last name;E-mail;What to fix');
    expect(csv.text.split('\r\n')).toHaveLength(5);
  });

  it('lets a changed mapping recompute the preview', async () => {
    const { client, agent } = await coordinatorOfNewClient();
    const file = 'Col A,Col B,Col C\r\nAda,Pike,ada@hp.example\r\n';
    const draft = await uploadRoster(agent, client.id, file).expect(201);
    expect(draft.body.mappingProblems.length).toBeGreaterThan(0);
    // Col C holds addresses, so it was taken for the e-mail and is marked as a guess.
    expect(draft.body.mapping).toEqual(['extra', 'extra', 'email']);
    expect(draft.body.guessedColumns).toEqual([2]);
    await agent
      .post(`/api/clients/${client.id}/roster/imports/${draft.body.id}/commit`)
      .send({ officeTimeZones: {} })
      .expect(409);
    const remapped = await agent
      .put(`/api/clients/${client.id}/roster/imports/${draft.body.id}/mapping`)
      .send({ mapping: ['givenName', 'familyName', 'email'] })
      .expect(200);
    expect(remapped.body.mappingProblems).toEqual([]);
    expect(remapped.body.counts.add).toBe(1);
  });

  it('refuses files that cannot be a roster with a clear message', async () => {
    const { client, agent } = await coordinatorOfNewClient();
    const empty = await uploadRoster(agent, client.id, '').expect(422);
    expect(empty.body.error.message).toMatch(/empty/);
    const binary = await uploadRoster(agent, client.id, new Uint8Array([0, 1, 2, 3, 0, 0])).expect(
      422,
    );
    expect(binary.body.error.message).toMatch(/not text/);
    const big = await uploadRoster(agent, client.id, new Uint8Array(13 * 1024 * 1024).fill(65));
    expect(big.status).toBe(413);
    expect(big.body.error.message).toMatch(/10 MB/);
  });
});

describe('roster access', () => {
  it('a coordinator of another client can neither preview nor commit into this roster', async () => {
    const { client, agent } = await coordinatorOfNewClient();
    const draft = await uploadRoster(agent, client.id, firstFile).expect(201);
    const other = await coordinatorOfNewClient();
    const upload = await uploadRoster(other.agent, client.id, firstFile);
    expect(upload.status).toBe(404);
    await other.agent
      .get(`/api/clients/${client.id}/roster/imports/${draft.body.id}/rows`)
      .expect(404);
    await other.agent
      .post(`/api/clients/${client.id}/roster/imports/${draft.body.id}/commit`)
      .send({ officeTimeZones: zones })
      .expect(404);
    // Through their own client's path the draft is not found either.
    await other.agent
      .post(`/api/clients/${other.client.id}/roster/imports/${draft.body.id}/commit`)
      .send({ officeTimeZones: zones })
      .expect(404);
    expect(await rosterOf(client.id)).toEqual([]);
  });

  it("the studio admin imports on a client's behalf", async () => {
    const client = await insertClient(t.db);
    await insertOffice(t.db, client.id, 'Leeds', 'Europe/London');
    const admin = await insertStaff(t.db);
    const agent = await signedInAgent(t, admin.email);
    const draft = await uploadRoster(agent, client.id, firstFile).expect(201);
    expect(draft.body.newOffices).toEqual(['Porto', 'Rotterdam']);
    await agent
      .post(`/api/clients/${client.id}/roster/imports/${draft.body.id}/commit`)
      .send({ officeTimeZones: zones })
      .expect(201);
    expect(await rosterOf(client.id)).toHaveLength(3);
  });
});
