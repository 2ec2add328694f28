import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { insertClient, insertStaff, TEST_PASSWORD } from '../factories/accounts';
import { startTestApp, type TestApp } from '../setup/test-app';
import { signedInAgent } from './helpers';

let t: TestApp;
beforeAll(async () => {
  t = await startTestApp();
});
afterAll(() => t.close());

describe('password sign-in', () => {
  it('signs a coordinator in with an HttpOnly, SameSite=Lax cookie and reports the role', async () => {
    const client = await insertClient(t.db, { name: 'Halvorsen Test' });
    const user = await insertStaff(t.db, { role: 'coordinator', clientId: client.id });
    const response = await request(t.app)
      .post('/api/session')
      .send({ email: `  ${user.email.toUpperCase()} `, password: TEST_PASSWORD })
      .expect(201);
    expect(response.body.user).toMatchObject({
      role: 'coordinator',
      clientId: client.id,
      clientName: 'Halvorsen Test',
    });
    const cookie = String(response.headers['set-cookie']);
    expect(cookie).toMatch(/likeness_session=/);
    expect(cookie).toMatch(/HttpOnly/i);
    expect(cookie).toMatch(/SameSite=Lax/i);
    expect(cookie).not.toMatch(/Secure/i);
  });

  it('marks the cookie Secure when served over HTTPS behind a trusted proxy', async () => {
    const secure = await startTestApp({ env: { TRUST_PROXY: 'true' } });
    try {
      const user = await insertStaff(secure.db);
      const response = await request(secure.app)
        .post('/api/session')
        .set('X-Forwarded-Proto', 'https')
        .send({ email: user.email, password: TEST_PASSWORD })
        .expect(201);
      expect(String(response.headers['set-cookie'])).toMatch(/Secure/);
    } finally {
      await secure.close();
    }
  });

  it('answers a wrong password and an unknown e-mail with the same refusal', async () => {
    const user = await insertStaff(t.db);
    const wrong = await request(t.app)
      .post('/api/session')
      .send({ email: user.email, password: 'not the password' });
    const unknown = await request(t.app)
      .post('/api/session')
      .send({ email: 'nobody@nowhere.example', password: 'not the password' });
    expect(wrong.status).toBe(401);
    expect(unknown.status).toBe(401);
    expect(wrong.body).toEqual(unknown.body);
    expect(wrong.headers['set-cookie']).toBeUndefined();
  });

  it('refuses a deactivated account with the same answer', async () => {
    const user = await insertStaff(t.db, { role: 'photographer', active: false });
    const response = await request(t.app)
      .post('/api/session')
      .send({ email: user.email, password: TEST_PASSWORD });
    expect(response.status).toBe(401);
    expect(response.body.error.code).toBe('wrong_credentials');
  });

  it('rejects malformed input with field errors and no session', async () => {
    const response = await request(t.app)
      .post('/api/session')
      .send({ email: 'not-an-address', password: '' });
    expect(response.status).toBe(400);
    expect(response.body.error.details.fieldErrors.email[0]).toMatch(/valid e-mail/);
    expect(response.body.error.details.fieldErrors.password[0]).toMatch(/password/);
  });

  it('refuses form-encoded posts, which a cross-site form could send', async () => {
    const user = await insertStaff(t.db);
    const response = await request(t.app)
      .post('/api/session')
      .type('form')
      .send({ email: user.email, password: TEST_PASSWORD });
    expect(response.status).toBe(415);
  });
});

describe('sessions', () => {
  it('returns the signed-in user, then 401 after sign-out, and the old cookie stays dead', async () => {
    const user = await insertStaff(t.db, { role: 'photographer' });
    const agent = await signedInAgent(t, user.email);
    const me = await agent.get('/api/session').expect(200);
    expect(me.body.user).toMatchObject({ id: user.id, role: 'photographer' });
    const second = await request(t.app)
      .post('/api/session')
      .send({ email: user.email, password: TEST_PASSWORD });
    const cookie = String(second.headers['set-cookie']).split(';')[0] ?? '';

    await agent.delete('/api/session').expect(204);
    await agent.get('/api/session').expect(401);

    // Sign-out ends the session on the server: replaying the cookie of a signed-out session fails.
    const replay = request.agent(t.app);
    await replay.get('/api/session').set('Cookie', cookie).expect(200);
    await replay.delete('/api/session').set('Cookie', cookie).expect(204);
    await request(t.app).get('/api/session').set('Cookie', cookie).expect(401);
    const stored = await t.db
      .selectFrom('sessions')
      .select('id')
      .where('userId', '=', user.id)
      .execute();
    expect(stored).toHaveLength(0);
  });

  it('expires a session after SESSION_TTL_HOURS', async () => {
    const user = await insertStaff(t.db);
    const agent = await signedInAgent(t, user.email);
    t.clock.advance(t.config.sessionTtlMs - 60_000);
    await agent.get('/api/session').expect(200);
    t.clock.advance(120_000);
    const expired = await agent.get('/api/session');
    expect(expired.status).toBe(401);
    expect(expired.body.error.code).toBe('unauthenticated');
  });

  it('ends every session of an account the admin deactivates', async () => {
    const admin = await insertStaff(t.db);
    const photographer = await insertStaff(t.db, { role: 'photographer' });
    const adminAgent = await signedInAgent(t, admin.email);
    const photographerAgent = await signedInAgent(t, photographer.email);
    await adminAgent.patch(`/api/users/${photographer.id}`).send({ active: false }).expect(200);
    await photographerAgent.get('/api/session').expect(401);
  });

  it('stores only a hash of the session token', async () => {
    const user = await insertStaff(t.db);
    const response = await request(t.app)
      .post('/api/session')
      .send({ email: user.email, password: TEST_PASSWORD });
    const token =
      /likeness_session=([^;]+)/.exec(String(response.headers['set-cookie']))?.[1] ?? '';
    const rows = await t.db
      .selectFrom('sessions')
      .select('tokenHash')
      .where('userId', '=', user.id)
      .execute();
    expect(token.length).toBeGreaterThan(30);
    expect(rows.map((row) => row.tokenHash)).not.toContain(token);
  });
});

describe('health', () => {
  it('reports the database state', async () => {
    const response = await request(t.app).get('/api/health').expect(200);
    expect(response.body).toMatchObject({ status: 'ok', database: { state: 'up' } });
  });

  it('answers unknown API paths with a JSON 404', async () => {
    const response = await request(t.app).get('/api/nothing-here').expect(404);
    expect(response.body.error.code).toBe('not_found');
  });
});
