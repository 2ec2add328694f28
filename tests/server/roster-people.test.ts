import Papa from 'papaparse';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { insertClient, insertStaff } from '../factories/accounts';
import { uploadRoster } from '../factories/roster';
import { startTestApp, type TestApp } from '../setup/test-app';
import { signedInAgent } from './helpers';

let t: TestApp;
let clientId: string;
let agent: Awaited<ReturnType<typeof signedInAgent>>;

// Invented staff; the phone-like and formula-like cells exercise the export's neutralising.
const roster = [
  'First name,Last name,E-mail,Employee ID,Department,Office,Desk phone',
  'Ines,Carvalho,ines@hp.example,HP-001,Design,Porto,+351 22 000 0000',
  'Tom,Ashby,tom@hp.example,HP-002,Structures,Leeds,',
  '"Sanne ""S""",de Vries,sanne@hp.example,HP-003,"Design, Civil",Rotterdam,=1+2',
  'Priya,Nair,priya@hp.example,HP-004,Structures,Leeds,@home',
].join('\r\n');

beforeAll(async () => {
  t = await startTestApp();
  clientId = (await insertClient(t.db, { name: 'Halvorsen & Pike Engineering' })).id;
  const coordinator = await insertStaff(t.db, { role: 'coordinator', clientId });
  agent = await signedInAgent(t, coordinator.email);
  const draft = await uploadRoster(agent, clientId, roster).expect(201);
  await agent
    .post(`/api/clients/${clientId}/roster/imports/${draft.body.id}/commit`)
    .send({
      officeTimeZones: {
        Porto: 'Europe/Lisbon',
        Leeds: 'Europe/London',
        Rotterdam: 'Europe/Amsterdam',
      },
    })
    .expect(201);
});
afterAll(() => t.close());

const list = (query: string) => agent.get(`/api/clients/${clientId}/people?${query}`).expect(200);

describe('people directory', () => {
  it('pages, sorts and searches on the server', async () => {
    const page = await list('pageSize=5&sort=email&direction=desc');
    expect(page.body.total).toBe(4);
    expect(page.body.people.map((p: { email: string }) => p.email)).toEqual([
      'tom@hp.example',
      'sanne@hp.example',
      'priya@hp.example',
      'ines@hp.example',
    ]);
    expect(page.body.departments).toEqual(['Design', 'Design, Civil', 'Structures']);
    const search = await list('q=ashby');
    expect(search.body.people.map((p: { givenName: string }) => p.givenName)).toEqual(['Tom']);
    const byFullName = await list('q=Tom%20Ash');
    expect(byFullName.body.total).toBe(1);
    const byDepartment = await list('department=Structures&sort=name');
    expect(byDepartment.body.people.map((p: { familyName: string }) => p.familyName)).toEqual([
      'Ashby',
      'Nair',
    ]);
    const byOffice = await list(`officeId=${byDepartment.body.people[0].officeId}`);
    expect(byOffice.body.total).toBe(2);
    // People alike in the sorted column (all in Leeds) come in name order, whichever way: six
    // of them, so an order by id alone would match by chance once in 720 runs.
    const officeId = byDepartment.body.people[0].officeId as string;
    const extra = ['Zeller', 'Moss', 'Brandt', 'Quill'];
    await t.db
      .insertInto('people')
      .values(
        extra.map((familyName) => ({
          clientId,
          officeId,
          givenName: 'Ada',
          familyName,
          email: `${familyName.toLowerCase()}@hp.example`,
        })),
      )
      .execute();
    try {
      for (const direction of ['asc', 'desc']) {
        const sorted = await list(`sort=office&direction=${direction}`);
        const leeds = sorted.body.people
          .filter((p: { officeName: string }) => p.officeName === 'Leeds')
          .map((p: { familyName: string }) => p.familyName);
        expect(leeds).toEqual(['Ashby', 'Brandt', 'Moss', 'Nair', 'Quill', 'Zeller']);
      }
    } finally {
      await t.db.deleteFrom('people').where('familyName', 'in', extra).execute();
    }
  });

  it('adds and edits a person by hand with the same validation', async () => {
    const bad = await agent
      .post(`/api/clients/${clientId}/people`)
      .send({ givenName: '', familyName: 'X', email: 'nope' })
      .expect(400);
    expect(Object.keys(bad.body.error.details.fieldErrors).sort()).toEqual(['email', 'givenName']);
    const taken = await agent
      .post(`/api/clients/${clientId}/people`)
      .send({ givenName: 'T', familyName: 'A', email: 'TOM@hp.example' })
      .expect(409);
    expect(taken.body.error.details.fieldErrors.email).toBeDefined();
    const added = await agent
      .post(`/api/clients/${clientId}/people`)
      .send({ givenName: ' Maja ', familyName: 'Berg', email: 'Maja@HP.example', employeeId: '' })
      .expect(201);
    expect(added.body).toMatchObject({
      givenName: 'Maja',
      email: 'maja@hp.example',
      employeeId: null,
    });
    const edited = await agent
      .patch(`/api/clients/${clientId}/people/${added.body.id}`)
      .send({
        givenName: 'Maja',
        familyName: 'Berg-Lund',
        email: 'maja@hp.example',
        jobTitle: 'Engineer',
      })
      .expect(200);
    expect(edited.body).toMatchObject({ familyName: 'Berg-Lund', jobTitle: 'Engineer' });
    const off = await agent
      .patch(`/api/clients/${clientId}/people/${added.body.id}`)
      .send({ active: false })
      .expect(200);
    expect(off.body.active).toBe(false);
    expect((await list('status=inactive')).body.people.map((p: { id: string }) => p.id)).toEqual([
      added.body.id,
    ]);
    await agent
      .patch(`/api/clients/${clientId}/people/${added.body.id}`)
      .send({ active: true })
      .expect(200);
    // Erasure needs the e-mail typed back, then removes the person and leaves no personal data in the audit.
    await agent
      .post(`/api/clients/${clientId}/people/${added.body.id}/erasure`)
      .send({ confirmEmail: 'x@y.example' })
      .expect(400);
    await agent
      .post(`/api/clients/${clientId}/people/${added.body.id}/erasure`)
      .send({ confirmEmail: 'MAJA@hp.example' })
      .expect(204);
    expect(
      await t.db.selectFrom('people').select('id').where('id', '=', added.body.id).execute(),
    ).toEqual([]);
    const audit = await t.db
      .selectFrom('auditEvents')
      .selectAll()
      .where('subjectId', '=', added.body.id)
      .execute();
    expect(audit.map((entry) => entry.action)).toContain('person.erased');
    expect(JSON.stringify(audit)).not.toMatch(/maja|berg/i);
  });

  it('exports CSV with a BOM, CRLF and formula cells neutralised (OWASP CSV Injection)', async () => {
    const response = await agent.get(`/api/clients/${clientId}/people/export.csv`).expect(200);
    expect(response.headers['content-type']).toMatch(/text\/csv; charset=utf-8/);
    const text = response.text;
    expect(text.startsWith('\uFEFF')).toBe(true);
    const parsed = Papa.parse<string[]>(text.slice(1), { skipEmptyLines: true });
    expect(parsed.data[0]).toEqual([
      'Given name',
      'Family name',
      'Preferred name',
      'Work e-mail',
      'Employee id',
      'Department',
      'Job title',
      'Office',
      'Status',
      'Desk phone',
    ]);
    const phones = parsed.data.slice(1).map((row) => row[9]);
    // OWASP CSV Injection: = + @ at the start get a leading apostrophe.
    expect(phones).toEqual(['', "'+351 22 000 0000", "'@home", "'=1+2"]);
    expect(text).toContain('"Sanne ""S"""');
  });

  it('round trip: exporting and importing the export changes nothing', async () => {
    const exported = await agent.get(`/api/clients/${clientId}/people/export.csv`).expect(200);
    const draft = await uploadRoster(agent, clientId, exported.text, 'people.csv').expect(201);
    expect(draft.body.mappingProblems).toEqual([]);
    expect(draft.body.counts).toEqual({
      add: 0,
      update: 0,
      conflict: 0,
      unchanged: 4,
      error: 0,
      missing: 0,
    });
  });

  it("answers 404 for another client's people, as for a missing client", async () => {
    const other = await insertClient(t.db);
    const stranger = await insertStaff(t.db, { role: 'coordinator', clientId: other.id });
    const strangerAgent = await signedInAgent(t, stranger.email);
    await strangerAgent.get(`/api/clients/${clientId}/people`).expect(404);
    await strangerAgent.get(`/api/clients/${clientId}/people/export.csv`).expect(404);
    await strangerAgent.get('/api/clients/00000000-0000-4000-8000-000000000000/people').expect(404);
  });
});
