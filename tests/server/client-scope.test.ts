import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { insertClient, insertOffice, insertPerson, insertStaff } from '../factories/accounts';
import { startTestApp, type TestApp } from '../setup/test-app';
import { signedInAgent, signedInSitter } from './helpers';

let t: TestApp;
let ours: { id: string };
let theirs: { id: string };
beforeAll(async () => {
  t = await startTestApp();
  ours = await insertClient(t.db, { name: 'Ours Ltd' });
  theirs = await insertClient(t.db, { name: 'Theirs plc' });
  const office = await insertOffice(t.db, ours.id, 'Rotterdam', 'Europe/Amsterdam');
  await insertPerson(t.db, ours.id, { officeId: office.id });
  await insertPerson(t.db, theirs.id);
});
afterAll(() => t.close());

describe('a coordinator sees only their own client', () => {
  it('lists only their client', async () => {
    const coordinator = await insertStaff(t.db, { role: 'coordinator', clientId: ours.id });
    const agent = await signedInAgent(t, coordinator.email);
    const response = await agent.get('/api/clients').expect(200);
    expect(response.body.clients.map((client: { name: string }) => client.name)).toEqual([
      'Ours Ltd',
    ]);
    expect(response.body.clients[0].offices[0]).toMatchObject({
      name: 'Rotterdam',
      activePeople: 1,
    });
  });

  it("gets 404 for another client's id, the same as for a missing one", async () => {
    const coordinator = await insertStaff(t.db, { role: 'coordinator', clientId: ours.id });
    const agent = await signedInAgent(t, coordinator.email);
    const other = await agent.get(`/api/clients/${theirs.id}`);
    const missing = await agent.get('/api/clients/00000000-0000-4000-8000-000000000000');
    expect(other.status).toBe(404);
    expect(missing.status).toBe(404);
    expect(other.body.error.code).toBe(missing.body.error.code);
  });

  it('lets the studio admin see every client', async () => {
    const admin = await insertStaff(t.db);
    const agent = await signedInAgent(t, admin.email);
    const response = await agent.get('/api/clients').expect(200);
    expect(response.body.clients.map((client: { name: string }) => client.name)).toEqual([
      'Ours Ltd',
      'Theirs plc',
    ]);
  });
});

describe('a sitter sees only themself', () => {
  it('reads their own profile and nothing that names another person', async () => {
    const person = await insertPerson(t.db, ours.id, { givenName: 'Noor' });
    const agent = await signedInSitter(t, person.email);
    const me = await agent.get('/api/sitters/me').expect(200);
    expect(me.body).toMatchObject({ id: person.id, givenName: 'Noor', clientName: 'Ours Ltd' });
    await agent.get('/api/clients').expect(403);
    await agent.get('/api/users').expect(403);
  });
});

describe('studio admin manages the team', () => {
  it('invites a coordinator only with a client, and refuses a taken e-mail', async () => {
    const admin = await insertStaff(t.db);
    const agent = await signedInAgent(t, admin.email);
    const missingClient = await agent
      .post('/api/users')
      .send({ email: 'c@ours.example', displayName: 'C', role: 'coordinator' });
    expect(missingClient.status).toBe(400);
    expect(missingClient.body.error.details.fieldErrors.clientId).toBeDefined();
    await agent
      .post('/api/users')
      .send({ email: 'c@ours.example', displayName: 'C', role: 'coordinator', clientId: ours.id })
      .expect(201);
    const taken = await agent
      .post('/api/users')
      .send({ email: 'C@Ours.example', displayName: 'C again', role: 'photographer' });
    expect(taken.status).toBe(409);
  });

  it('cannot deactivate itself', async () => {
    const admin = await insertStaff(t.db);
    const agent = await signedInAgent(t, admin.email);
    const response = await agent.patch(`/api/users/${admin.id}`).send({ active: false });
    expect(response.status).toBe(409);
  });

  it('creates a client with a readable slug and refuses a duplicate name', async () => {
    const admin = await insertStaff(t.db);
    const agent = await signedInAgent(t, admin.email);
    const created = await agent.post('/api/clients').send({ name: 'Brückner & Søn' }).expect(201);
    expect(created.body.slug).toBe('bruckner-and-son');
    await agent.post('/api/clients').send({ name: 'brückner & søn' }).expect(409);
  });
});
