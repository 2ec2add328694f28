import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { insertStaff, TEST_PASSWORD } from '../factories/accounts';
import { startTestApp, type TestApp } from '../setup/test-app';

let t: TestApp;
beforeAll(async () => {
  t = await startTestApp({ env: { RATE_LIMIT_PER_ACCOUNT: '3', RATE_LIMIT_PER_ADDRESS: '10' } });
});
afterAll(() => t.close());

describe('rate limits', () => {
  it('stops password guessing on one account, even with the right password, known or not', async () => {
    const user = await insertStaff(t.db);
    for (let attempt = 0; attempt < 3; attempt += 1) {
      await request(t.app)
        .post('/api/session')
        .send({ email: user.email, password: 'guess' })
        .expect(401);
    }
    const blocked = await request(t.app)
      .post('/api/session')
      .send({ email: user.email, password: TEST_PASSWORD });
    expect(blocked.status).toBe(429);
    expect(blocked.body.error.code).toBe('rate_limited');

    const ghost = 'ghost@nowhere.example';
    for (let attempt = 0; attempt < 3; attempt += 1) {
      await request(t.app)
        .post('/api/session')
        .send({ email: ghost, password: 'guess' })
        .expect(401);
    }
    const ghostBlocked = await request(t.app)
      .post('/api/session')
      .send({ email: ghost, password: 'guess' });
    expect(ghostBlocked.status).toBe(429);
    expect(ghostBlocked.body).toEqual(blocked.body);
  });

  it('does not count correct sign-ins, so several tablets can sign in', async () => {
    const user = await insertStaff(t.db, { role: 'photographer' });
    for (let attempt = 0; attempt < 5; attempt += 1) {
      await request(t.app)
        .post('/api/session')
        .send({ email: user.email, password: TEST_PASSWORD })
        .expect(201);
    }
  });

  it('limits link requests per address across different e-mails', async () => {
    const statuses: number[] = [];
    for (let n = 0; n < 12; n += 1) {
      const response = await request(t.app)
        .post('/api/sign-in-links')
        .send({ email: `someone${n}@x.example` });
      statuses.push(response.status);
    }
    expect(statuses.slice(0, 10).every((status) => status === 202)).toBe(true);
    expect(statuses.slice(10)).toEqual([429, 429]);
  });

  it('keeps the counters in PostgreSQL, shared by every app process', async () => {
    const rows = await t.db.selectFrom('rateLimitCounters').select(['key', 'hits']).execute();
    expect(rows.some((row) => row.key.startsWith('sign-in:account:') && row.hits >= 4)).toBe(true);
  });
});
