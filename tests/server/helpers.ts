import { buffer } from 'node:stream/consumers';
import { runOnce } from 'graphile-worker';
import request from 'supertest';
import { createSmtpMailer } from '../../server/adapters/mail/mailer';
import { toTaskList, workerLogger } from '../../server/jobs/job-queue';
import { createLogger } from '../../server/lib/logger';
import { createAuthLinkJobs } from '../../server/modules/auth/auth-link-jobs';
import type { TestApp } from '../setup/test-app';
import { TEST_PASSWORD } from '../factories/accounts';

/** A supertest agent that keeps cookies, signed in with a password. */
export async function signedInAgent(testApp: TestApp, email: string) {
  const agent = request.agent(testApp.app);
  await agent.post('/api/session').send({ email, password: TEST_PASSWORD }).expect(201);
  return agent;
}

export function linkTokenFrom(text: string, kind: 'link' | 'password'): string {
  const match = new RegExp(`/${kind}/([A-Za-z0-9_-]+)`).exec(text);
  if (!match?.[1]) throw new Error(`No /${kind}/ link in: ${text}`);
  return match[1];
}

/**
 * Runs the queued sign-in-link and password-reset jobs now, as the worker would; only those
 * tasks, so other queued work (invitations, reminders) waits for the test that wants it.
 */
export async function sendQueuedLinks(testApp: TestApp): Promise<void> {
  const mailer = createSmtpMailer({ smtpUrl: testApp.mail.smtpUrl, from: testApp.config.mailFrom });
  try {
    const jobs = createAuthLinkJobs({
      db: testApp.db,
      clock: testApp.clock,
      mailer,
      config: testApp.config,
    });
    const logger = createLogger('silent');
    await runOnce({
      connectionString: testApp.database.url,
      taskList: toTaskList(jobs.handlers()),
      concurrency: 1,
      noHandleSignals: true,
      logger: workerLogger(logger),
    });
  } finally {
    mailer.close();
  }
}

/** A sitter's session, started the way a sitter starts it: link by e-mail, then redeem. */
export async function signedInSitter(testApp: TestApp, email: string) {
  await request(testApp.app).post('/api/sign-in-links').send({ email }).expect(202);
  await sendQueuedLinks(testApp);
  const mail = await testApp.mail.waitFor(email);
  const agent = request.agent(testApp.app);
  await agent
    .post('/api/sign-in-links/redeem')
    .send({ token: linkTokenFrom(mail.text, 'link') })
    .expect(201);
  return agent;
}

/** supertest hands a raw response to a parser: collect it as bytes (ZIPs, images). */
export function binaryBody(res: unknown, done: (error: Error | null, body: Buffer) => void) {
  buffer(res as NodeJS.ReadableStream).then(
    (body) => done(null, body),
    (error: Error) => done(error, Buffer.alloc(0)),
  );
}
