import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { startMailCatcher } from '../../server/adapters/mail/mail-catcher';
import { createSmtpMailer, type OutgoingMail } from '../../server/adapters/mail/mailer';
import { mailIdentity } from '../../server/config';
import { createCaughtMailStore } from '../../server/modules/dev-mailbox/dev-mailbox.repository';
import { insertStaff } from '../factories/accounts';
import { startTestApp, type TestApp } from '../setup/test-app';
import { binaryBody, signedInAgent } from './helpers';

let t: TestApp;
beforeAll(async () => {
  t = await startTestApp();
});
afterAll(() => t.close());

// A 1×1 PNG (the smallest valid image: signature, IHDR, IDAT, IEND).
const dot = Buffer.from(
  'iVBORw0KGgoAAAANSUhEUgAAAAEAAAABCAYAAAAfFcSJAAAADUlEQVR42mNk+M9QDwADhgGAWjR9awAAAABJRU5ErkJggg==',
  'base64',
);

const sample = (to: string): OutgoingMail => ({
  to,
  subject: 'Your portrait sitting is booked',
  text: 'Hello Robin, you are booked.',
  html: '<!doctype html><html><body><h1>Hello Robin,</h1><img src="cid:dot@test" alt="pass"></body></html>',
  attachments: [{ filename: 'pass.png', content: dot, contentType: 'image/png', cid: 'dot@test' }],
  calendar: {
    method: 'PUBLISH',
    filename: 'invite.ics',
    content: 'BEGIN:VCALENDAR\r\nEND:VCALENDAR\r\n',
  },
});

describe('the development mailbox', () => {
  it('keeps caught mail in the database, so a restarted catcher still shows it', async () => {
    const store = createCaughtMailStore(t.db);
    const first = await startMailCatcher(0, { store });
    const mailer = createSmtpMailer({ smtpUrl: first.smtpUrl, ...mailIdentity(t.config) });
    await mailer.send(sample('robin@halvorsen-pike.example'));
    const caught = await first.waitFor('robin@halvorsen-pike.example');
    mailer.close();
    await first.close();

    const restarted = await startMailCatcher(0, { store });
    try {
      const again = restarted.get(caught.id);
      expect(again).toMatchObject({
        subject: 'Your portrait sitting is booked',
        from: '"Northlight Portrait Co." <bookings@northlight.example>',
        to: ['robin@halvorsen-pike.example'],
      });
      expect(again!.html).toContain('<h1>Hello Robin,</h1>');
      // nodemailer sends the calendar twice (an alternative part and a file): both are kept.
      expect(again!.attachments.map((item) => item.filename)).toEqual(
        expect.arrayContaining(['pass.png', 'invite.ics']),
      );
      expect(Buffer.from(again!.attachments[0]!.content, 'base64').equals(dot)).toBe(true);
    } finally {
      await restarted.close();
    }
  });

  it('keeps only the newest messages it is told to keep', async () => {
    const store = createCaughtMailStore(t.db);
    const catcher = await startMailCatcher(0, { store, keep: 2 });
    const mailer = createSmtpMailer({ smtpUrl: catcher.smtpUrl, ...mailIdentity(t.config) });
    for (const name of ['ana', 'bo', 'cy']) {
      await mailer.send({ ...sample(`${name}@halvorsen-pike.example`), subject: name });
    }
    mailer.close();
    await catcher.close();
    const kept = await store.load(10);
    expect(kept.map((message) => message.subject)).toEqual(['cy', 'bo']);
  });

  it('shows the HTML part with its images and serves each attachment as a download', async () => {
    const admin = await insertStaff(t.db, { role: 'studio_admin' });
    const agent = await signedInAgent(t, admin.email);
    const mailer = createSmtpMailer({ smtpUrl: t.mail.smtpUrl, ...mailIdentity(t.config) });
    await mailer.send(sample('ines@halvorsen-pike.example'));
    mailer.close();
    const caught = await t.mail.waitFor('ines@halvorsen-pike.example');

    const list = await agent.get('/api/dev/mailbox').expect(200);
    const listed = list.body.messages.find((item: { id: string }) => item.id === caught.id);
    expect(listed).toMatchObject({ attachmentCount: caught.attachments.length });
    expect(listed).not.toHaveProperty('html');

    const opened = await agent.get(`/api/dev/mailbox/${caught.id}`).expect(200);
    // The inline image is inside the HTML part itself (its cid: link resolved to data:).
    expect(opened.body.html).toContain('data:image/png;base64,');
    expect(opened.body.attachments).toEqual(
      expect.arrayContaining([
        { index: 0, filename: 'pass.png', contentType: 'image/png', bytes: dot.length },
        expect.objectContaining({ filename: 'invite.ics' }),
      ]),
    );

    const file = await agent
      .get(`/api/dev/mailbox/${caught.id}/attachments/0`)
      .buffer(true)
      .parse(binaryBody)
      .expect(200);
    expect(file.headers['content-type']).toBe('image/png');
    expect(file.headers['content-disposition']).toBe("attachment; filename*=UTF-8''pass.png");
    expect((file.body as Buffer).equals(dot)).toBe(true);
    await agent.get(`/api/dev/mailbox/${caught.id}/attachments/7`).expect(404);
    await agent.get('/api/dev/mailbox/not-an-id/attachments/0').expect(404);
  });
});
