import { sql } from 'kysely';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { insertClient, insertPerson, insertStaff } from '../factories/accounts';
import { startTestApp, type TestApp } from '../setup/test-app';
import { linkTokenFrom, sendQueuedLinks, signedInAgent } from './helpers';

let t: TestApp;
let clientId: string;
beforeAll(async () => {
  t = await startTestApp();
  clientId = (await insertClient(t.db)).id;
});
afterAll(() => t.close());

const linkTokenCount = async () =>
  Number(
    (
      await t.db
        .selectFrom('linkTokens')
        .select((eb) => eb.fn.countAll<string>().as('n'))
        .executeTakeFirstOrThrow()
    ).n,
  );

describe('sitter sign-in links', () => {
  it('e-mails a link that signs the sitter in once; the second use fails', async () => {
    const person = await insertPerson(t.db, clientId);
    await request(t.app).post('/api/sign-in-links').send({ email: person.email }).expect(202);
    await sendQueuedLinks(t);
    const mail = await t.mail.waitFor(person.email);
    expect(mail.text).toMatch(/works once and for 30 minutes/);
    expect(mail.html).toContain('<a href="http://likeness.test/link/');
    const token = linkTokenFrom(mail.text, 'link');

    const agent = request.agent(t.app);
    const first = await agent.post('/api/sign-in-links/redeem').send({ token }).expect(201);
    expect(first.body.user).toMatchObject({
      kind: 'sitter',
      role: 'sitter',
      id: person.id,
      clientId,
    });
    await agent.get('/api/sitters/me').expect(200);

    const second = await request(t.app).post('/api/sign-in-links/redeem').send({ token });
    expect(second.status).toBe(410);
    expect(second.body.error.code).toBe('link_used');
  });

  it('stores only a hash of the link token', async () => {
    const person = await insertPerson(t.db, clientId);
    await request(t.app).post('/api/sign-in-links').send({ email: person.email }).expect(202);
    await sendQueuedLinks(t);
    const token = linkTokenFrom((await t.mail.waitFor(person.email)).text, 'link');
    const stored = await t.db
      .selectFrom('linkTokens')
      .select('tokenHash')
      .where('personId', '=', person.id)
      .execute();
    expect(stored).toHaveLength(1);
    expect(stored[0]?.tokenHash).not.toBe(token);
    expect(stored[0]?.tokenHash).toMatch(/^[0-9a-f]{64}$/);
  });

  it('refuses a link after SIGN_IN_LINK_TTL_MINUTES', async () => {
    const person = await insertPerson(t.db, clientId);
    await request(t.app).post('/api/sign-in-links').send({ email: person.email }).expect(202);
    await sendQueuedLinks(t);
    const token = linkTokenFrom((await t.mail.waitFor(person.email)).text, 'link');
    t.clock.advance(31 * 60_000);
    const response = await request(t.app).post('/api/sign-in-links/redeem').send({ token });
    expect(response.status).toBe(410);
    expect(response.body.error.code).toBe('link_expired');
  });

  it('keeps invitation links alive for seven days by default', async () => {
    expect(t.config.invitationLinkTtlMs).toBe(7 * 24 * 3_600_000);
    const person = await insertPerson(t.db, clientId);
    const auth = (await import('../../server/modules/auth/auth.service')).createAuthService({
      db: t.db,
      clock: t.clock,
      mailer: { send: async () => undefined, close: () => undefined },
      config: t.config,
      logger: (await import('../../server/lib/logger')).createLogger('silent'),
    });
    const url = await auth.issueSitterInvitationLink(person.id);
    t.clock.advance(6 * 24 * 3_600_000);
    const token = linkTokenFrom(url, 'link');
    await request(t.app).post('/api/sign-in-links/redeem').send({ token }).expect(201);
  });

  it('answers the same whether or not the address is on a roster, and sends nothing for unknowns', async () => {
    const person = await insertPerson(t.db, clientId);
    const known = await request(t.app).post('/api/sign-in-links').send({ email: person.email });
    const unknown = await request(t.app)
      .post('/api/sign-in-links')
      .send({ email: 'stranger@elsewhere.example' });
    expect(known.status).toBe(202);
    expect(unknown.status).toBe(202);
    expect(known.body).toEqual(unknown.body);
    await sendQueuedLinks(t);
    await t.mail.waitFor(person.email);
    await new Promise((resolve) => setTimeout(resolve, 200));
    expect(t.mail.list().some((mail) => mail.to.includes('stranger@elsewhere.example'))).toBe(
      false,
    );
  });

  it('sends no link to someone who has left the roster', async () => {
    const person = await insertPerson(t.db, clientId, { active: false });
    await request(t.app).post('/api/sign-in-links').send({ email: person.email }).expect(202);
    await sendQueuedLinks(t);
    await expect(t.mail.waitFor(person.email, { timeoutMs: 400 })).rejects.toThrow(/No mail/);
  });

  it('does no lookup in the request: a known and an unknown e-mail each queue one job, nothing else', async () => {
    const person = await insertPerson(t.db, clientId);
    const user = await insertStaff(t.db, { role: 'photographer' });
    const tokensBefore = await linkTokenCount();
    for (const [path, email] of [
      ['/api/sign-in-links', person.email],
      ['/api/sign-in-links', 'nobody.here@elsewhere.example'],
      ['/api/password-resets', user.email],
      ['/api/password-resets', 'nobody.here@elsewhere.example'],
    ] as const) {
      await request(t.app).post(path).send({ email }).expect(202);
    }
    // Nothing was looked up or issued on the request path: no token, no mail, four alike jobs.
    expect(await linkTokenCount()).toBe(tokensBefore);
    const jobs = await sql<{ task: string }>`
      select task_identifier as task from graphile_worker.jobs order by id`.execute(t.db);
    expect(jobs.rows.map((job) => job.task)).toEqual([
      'send_sign_in_link',
      'send_sign_in_link',
      'send_password_reset',
      'send_password_reset',
    ]);
    await sendQueuedLinks(t);
    expect(await linkTokenCount()).toBe(tokensBefore + 2);
    await t.mail.waitFor(person.email);
    await t.mail.waitFor(user.email);
    expect(t.mail.list().some((mail) => mail.to.includes('nobody.here@elsewhere.example'))).toBe(
      false,
    );
  });

  it('retires the older unused sign-in link when a new one is issued', async () => {
    const person = await insertPerson(t.db, clientId);
    await request(t.app).post('/api/sign-in-links').send({ email: person.email }).expect(202);
    await sendQueuedLinks(t);
    const older = linkTokenFrom((await t.mail.waitFor(person.email)).text, 'link');
    t.mail.clear();
    await request(t.app).post('/api/sign-in-links').send({ email: person.email }).expect(202);
    await sendQueuedLinks(t);
    const newer = linkTokenFrom((await t.mail.waitFor(person.email)).text, 'link');
    expect(newer).not.toBe(older);
    const stale = await request(t.app).post('/api/sign-in-links/redeem').send({ token: older });
    expect(stale.status).toBe(410);
    await request(t.app).post('/api/sign-in-links/redeem').send({ token: newer }).expect(201);
  });

  it('refuses a made-up token', async () => {
    const response = await request(t.app)
      .post('/api/sign-in-links/redeem')
      .send({ token: 'x'.repeat(43) });
    expect(response.status).toBe(410);
    expect(response.body.error.code).toBe('link_unknown');
  });
});

describe('staff passwords by link', () => {
  it('lets an invited photographer choose a password and sign in; the link then dies', async () => {
    const admin = await insertStaff(t.db);
    const agent = await signedInAgent(t, admin.email);
    const invited = await agent
      .post('/api/users')
      .send({
        email: 'new.photographer@studio.example',
        displayName: 'New Photographer',
        role: 'photographer',
      })
      .expect(201);
    expect(invited.body).toMatchObject({ hasPassword: false, active: true });
    const mail = await t.mail.waitFor('new.photographer@studio.example');
    expect(mail.subject).toMatch(/invited/);
    const token = linkTokenFrom(mail.text, 'password');

    const newcomer = request.agent(t.app);
    await newcomer
      .post('/api/passwords')
      .send({ token, password: 'a long enough secret', confirmPassword: 'a long enough secret' })
      .expect(201);
    await newcomer.get('/api/session').expect(200);
    await request(t.app)
      .post('/api/session')
      .send({ email: 'new.photographer@studio.example', password: 'a long enough secret' })
      .expect(201);
    const again = await request(t.app)
      .post('/api/passwords')
      .send({ token, password: 'another long secret', confirmPassword: 'another long secret' });
    expect(again.status).toBe(410);
  });

  it('resets a forgotten password and ends the old sessions', async () => {
    const user = await insertStaff(t.db, { role: 'photographer' });
    const oldAgent = await signedInAgent(t, user.email);
    const answer = await request(t.app)
      .post('/api/password-resets')
      .send({ email: user.email })
      .expect(202);
    const unknown = await request(t.app)
      .post('/api/password-resets')
      .send({ email: 'who@nowhere.example' })
      .expect(202);
    expect(answer.body).toEqual(unknown.body);
    await sendQueuedLinks(t);
    const token = linkTokenFrom((await t.mail.waitFor(user.email)).text, 'password');
    await request(t.app)
      .post('/api/passwords')
      .send({ token, password: 'fresh password here', confirmPassword: 'fresh password here' })
      .expect(201);
    await oldAgent.get('/api/session').expect(401);
  });

  it('checks the password rules with the shared schema', async () => {
    const response = await request(t.app)
      .post('/api/passwords')
      .send({ token: 'y'.repeat(43), password: 'short', confirmPassword: 'different' });
    expect(response.status).toBe(400);
    expect(response.body.error.details.fieldErrors.password[0]).toMatch(/12 characters/);
  });
});
