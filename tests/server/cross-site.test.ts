import { sql } from 'kysely';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { insertClient, insertOffice, insertPerson, insertStaff } from '../factories/accounts';
import { insertDay } from '../factories/days';
import { startTestApp, type TestApp } from '../setup/test-app';
import { signedInAgent } from './helpers';

// The forged requests a page on another site can send without a preflight: a bodiless
// text/plain POST carrying the victim's cookie (Fetch standard, "CORS-safelisted request").
let t: TestApp;
let coordinator: ReturnType<typeof request.agent>;
let admin: ReturnType<typeof request.agent>;
let dayId: string;
let staffId: string;

const jobCount = async () =>
  Number(
    (await sql<{ n: string }>`select count(*) as n from graphile_worker.jobs`.execute(t.db)).rows[0]
      ?.n,
  );

beforeAll(async () => {
  t = await startTestApp();
  const client = await insertClient(t.db);
  const office = await insertOffice(t.db, client.id);
  await insertPerson(t.db, client.id, { officeId: office.id });
  const photographer = await insertStaff(t.db, { role: 'photographer' });
  const day = await insertDay(t.db, {
    clientId: client.id,
    officeId: office.id,
    photographerIds: [photographer.id],
  });
  dayId = day.id;
  const coordinatorAccount = await insertStaff(t.db, { role: 'coordinator', clientId: client.id });
  const adminAccount = await insertStaff(t.db, { role: 'studio_admin' });
  staffId = (await insertStaff(t.db, { role: 'photographer', withPassword: false })).id;
  coordinator = await signedInAgent(t, coordinatorAccount.email);
  admin = await signedInAgent(t, adminAccount.email);
});
afterAll(() => t.close());

describe('cross-site guard on state-changing requests', () => {
  const forged = () => [
    { who: 'coordinator', path: `/api/days/${dayId}/reminders`, agent: coordinator },
    { who: 'coordinator', path: `/api/days/${dayId}/invitations`, agent: coordinator },
    { who: 'studio admin', path: `/api/users/${staffId}/invitation`, agent: admin },
  ];

  it('refuses a bodiless text/plain POST from a foreign Origin with 403, and queues nothing', async () => {
    const jobsBefore = await jobCount();
    for (const { who, path, agent } of forged()) {
      const response = await agent
        .post(path)
        .set('Content-Type', 'text/plain')
        .set('Origin', 'https://elsewhere.example');
      expect(response.status, `${who} ${path}`).toBe(403);
      expect(response.body.error.code).toBe('cross_site');
    }
    expect(await jobCount()).toBe(jobsBefore);
    expect(t.mail.list()).toHaveLength(0);
  });

  it('refuses the same when only Sec-Fetch-Site says cross-site or same-site', async () => {
    for (const site of ['cross-site', 'same-site']) {
      const response = await coordinator
        .post(`/api/days/${dayId}/reminders`)
        .set('Sec-Fetch-Site', site);
      expect(response.status, site).toBe(403);
    }
  });

  it('refuses DELETE and sign-in from another site too', async () => {
    const signOut = await coordinator.delete('/api/session').set('Origin', 'null');
    expect(signOut.status).toBe(403);
    // The session survived the forged sign-out.
    await coordinator.get('/api/session').expect(200);
    const signIn = await request(t.app)
      .post('/api/session')
      .set('Sec-Fetch-Site', 'cross-site')
      .send({ email: 'someone@x.example', password: 'whatever' });
    expect(signIn.status).toBe(403);
  });

  it('lets the app’s own pages through (same Origin, Sec-Fetch-Site same-origin)', async () => {
    const host = '127.0.0.1:80';
    const response = await coordinator
      .post(`/api/days/${dayId}/reminders`)
      .set('Host', host)
      .set('Origin', `http://${host}`)
      .set('Sec-Fetch-Site', 'same-origin');
    expect([401, 403]).not.toContain(response.status);
  });
});
