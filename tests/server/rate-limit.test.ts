import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { delayAfter } from '../../server/lib/sign-in-backoff';
import { insertStaff, TEST_PASSWORD } from '../factories/accounts';
import { startTestApp, type TestApp } from '../setup/test-app';

// TRUST_PROXY lets each request say which address it comes from (X-Forwarded-For), so one
// test can play an attacker and the account's owner at different addresses.
let t: TestApp;
beforeAll(async () => {
  t = await startTestApp({
    env: { RATE_LIMIT_PER_ADDRESS: '10', SIGN_IN_FREE_ATTEMPTS: '3', TRUST_PROXY: 'true' },
  });
});
afterAll(() => t.close());

const signIn = (from: string, email: string, password: string) =>
  request(t.app).post('/api/session').set('X-Forwarded-For', from).send({ email, password });
const askLink = (from: string, email: string) =>
  request(t.app).post('/api/sign-in-links').set('X-Forwarded-For', from).send({ email });

describe('sign-in back-off per address and account', () => {
  it('never locks the owner out: guesses from one address leave sign-in from another untouched', async () => {
    const admin = await insertStaff(t.db, { role: 'studio_admin' });
    for (let attempt = 0; attempt < 8; attempt += 1) {
      const guess = await signIn('203.0.113.7', admin.email, `guess ${attempt}`);
      expect([401, 429]).toContain(guess.status);
    }
    await signIn('198.51.100.20', admin.email, TEST_PASSWORD).expect(201);
  });

  it('makes one address wait longer after each further wrong password, then lets it try again', async () => {
    const user = await insertStaff(t.db, { role: 'photographer' });
    const from = '203.0.113.8';
    for (let attempt = 0; attempt < 3; attempt += 1) {
      await signIn(from, user.email, 'guess').expect(401);
    }
    // The fourth failure is counted and sets the first wait; the right password waits too.
    await signIn(from, user.email, 'guess').expect(401);
    const waiting = await signIn(from, user.email, TEST_PASSWORD).expect(429);
    expect(waiting.headers['retry-after']).toBe('2');
    expect(waiting.body.error.message).toMatch(/Wait 2 seconds/);

    t.clock.advance(2_000);
    await signIn(from, user.email, 'guess').expect(401);
    const longer = await signIn(from, user.email, 'guess').expect(429);
    expect(longer.headers['retry-after']).toBe('4');

    t.clock.advance(4_000);
    await signIn(from, user.email, TEST_PASSWORD).expect(201);
    // A correct sign-in clears the pair: the next typo costs nothing.
    await signIn(from, user.email, 'typo').expect(401);
    await signIn(from, user.email, TEST_PASSWORD).expect(201);
  });

  it('answers an unknown e-mail exactly like a known one', async () => {
    const user = await insertStaff(t.db, { role: 'photographer' });
    const answers = [];
    for (const email of [user.email, 'ghost@nowhere.example']) {
      const from = email === user.email ? '203.0.113.9' : '203.0.113.10';
      for (let attempt = 0; attempt < 4; attempt += 1) await signIn(from, email, 'guess');
      answers.push(await signIn(from, email, 'guess'));
    }
    expect(answers.map((answer) => answer.status)).toEqual([429, 429]);
    expect(answers[0]?.body).toEqual(answers[1]?.body);
  });

  it('grows the wait by doubling from 2 s, capped at SIGN_IN_MAX_WAIT_MINUTES', () => {
    const settings = t.config.signInBackoff;
    expect([3, 4, 5, 6].map((attempts) => delayAfter(attempts, settings))).toEqual([
      0, 2_000, 4_000, 8_000,
    ]);
    expect(delayAfter(40, settings)).toBe(15 * 60_000);
  });

  it('slows repeated link requests for one e-mail from one address, not the sitter elsewhere', async () => {
    const email = 'sitter.backoff@x.example';
    const statuses: number[] = [];
    for (let n = 0; n < 5; n += 1) statuses.push((await askLink('203.0.113.11', email)).status);
    expect(statuses).toEqual([202, 202, 202, 202, 429]);
    await askLink('198.51.100.21', email).expect(202);
  });

  it('limits link requests per address across different e-mails', async () => {
    const statuses: number[] = [];
    for (let n = 0; n < 12; n += 1) {
      statuses.push((await askLink('203.0.113.12', `someone${n}@x.example`)).status);
    }
    expect(statuses.slice(0, 10).every((status) => status === 202)).toBe(true);
    expect(statuses.slice(10)).toEqual([429, 429]);
  });

  it('keeps the counters in PostgreSQL, shared by every app process, with no e-mail in them', async () => {
    const counters = await t.db.selectFrom('rateLimitCounters').select(['key', 'hits']).execute();
    expect(counters.some((row) => row.key.startsWith('sign-in:address:'))).toBe(true);
    const pairs = await t.db.selectFrom('signInBackoff').select(['key', 'attempts']).execute();
    expect(pairs.length).toBeGreaterThan(0);
    expect(pairs.every((row) => /^[0-9a-f]{64}$/.test(row.key))).toBe(true);
  });
});
