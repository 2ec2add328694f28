import { buffer } from 'node:stream/consumers';
import request from 'supertest';
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

/** A sitter's session, started the way a sitter starts it: link by e-mail, then redeem. */
export async function signedInSitter(testApp: TestApp, email: string) {
  await request(testApp.app).post('/api/sign-in-links').send({ email }).expect(202);
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
