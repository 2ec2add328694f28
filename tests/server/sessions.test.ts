import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { insertClient, insertPerson, insertStaff } from '../factories/accounts';
import { startTestApp, type TestApp } from '../setup/test-app';
import { signedInAgent, signedInSitter } from './helpers';

let t: TestApp;
beforeAll(async () => {
  t = await startTestApp({ env: { RATE_LIMIT_PER_ACCOUNT: '1000' } });
});
afterAll(() => t.close());

describe('a person’s own sessions', () => {
  it('lists the sessions of the account, newest first, this one marked', async () => {
    const user = await insertStaff(t.db, { role: 'photographer' });
    const other = await insertStaff(t.db, { role: 'photographer' });
    await signedInAgent(t, other.email);
    const tablet = await signedInAgent(t, user.email);
    const laptop = request.agent(t.app);
    await laptop
      .post('/api/session')
      .set('User-Agent', 'Laptop browser')
      .send({ email: user.email, password: 'correct horse battery' })
      .expect(201);
    const listed = await laptop.get('/api/sessions').expect(200);
    expect(listed.body.sessions).toHaveLength(2);
    expect(listed.body.sessions[0]).toMatchObject({ current: true, userAgent: 'Laptop browser' });
    expect(listed.body.sessions[1].current).toBe(false);
    const fromTablet = await tablet.get('/api/sessions').expect(200);
    expect(fromTablet.body.sessions.map((s: { current: boolean }) => s.current)).toEqual([
      false,
      true,
    ]);
  });

  it('signs out everywhere else: the other sessions end, this one and other people’s stay', async () => {
    const user = await insertStaff(t.db, { role: 'studio_admin' });
    const bystander = await insertStaff(t.db, { role: 'photographer' });
    const bystanderAgent = await signedInAgent(t, bystander.email);
    const lost = await signedInAgent(t, user.email);
    const alsoLost = await signedInAgent(t, user.email);
    const here = await signedInAgent(t, user.email);

    const ended = await here.delete('/api/sessions').expect(200);
    expect(ended.body).toEqual({ ended: 2 });
    await lost.get('/api/session').expect(401);
    await alsoLost.get('/api/session').expect(401);
    await here.get('/api/session').expect(200);
    await bystanderAgent.get('/api/session').expect(200);
    expect((await here.get('/api/sessions').expect(200)).body.sessions).toHaveLength(1);
  });

  it('works for a sitter’s link sessions too', async () => {
    const client = await insertClient(t.db);
    const person = await insertPerson(t.db, client.id);
    const phone = await signedInSitter(t, person.email);
    const desk = await signedInSitter(t, person.email);
    expect((await desk.get('/api/sessions').expect(200)).body.sessions).toHaveLength(2);
    await desk.delete('/api/sessions').expect(200);
    await phone.get('/api/session').expect(401);
    await desk.get('/api/sitters/me').expect(200);
  });

  it('needs a session', async () => {
    await request(t.app).get('/api/sessions').expect(401);
    await request(t.app).delete('/api/sessions').expect(401);
  });
});
