import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createSmtpMailer } from '../../server/adapters/mail/mailer';
import { mailIdentity } from '../../server/config';
import { insertStaff, TEST_PASSWORD } from '../factories/accounts';
import {
  seriousAxeViolations,
  signInWithPassword,
  startE2e,
  type E2eEnvironment,
} from './support/browser';

let env: E2eEnvironment;
beforeAll(async () => {
  env = await startE2e();
});
afterAll(() => env?.close());

// A 1×1 PNG (signature, IHDR, IDAT, IEND).
const dot = Buffer.from(
  'iVBORw0KGgoAAAANSUhEUgAAAAEAAAABCAYAAAAfFcSJAAAADUlEQVR42mNk+M9QDwADhgGAWjR9awAAAABJRU5ErkJggg==',
  'base64',
);

describe('the development mailbox', () => {
  it('shows the HTML part with its inline image, the sender, and downloadable attachments', async () => {
    const { testApp } = env;
    const admin = await insertStaff(testApp.db, { role: 'studio_admin' });
    const mailer = createSmtpMailer({
      smtpUrl: testApp.mail.smtpUrl,
      ...mailIdentity(testApp.config),
    });
    await mailer.send({
      to: 'robin@halvorsen-pike.example',
      subject: 'Your portrait sitting is booked',
      text: 'Hello Robin, you are booked.',
      html: '<!doctype html><html><body><h1>Hello Robin, in HTML</h1><img id="pass" src="cid:dot@test" alt="Your pass"></body></html>',
      attachments: [
        { filename: 'pass.png', content: dot, contentType: 'image/png', cid: 'dot@test' },
      ],
      calendar: {
        method: 'PUBLISH',
        filename: 'invite.ics',
        content: 'BEGIN:VCALENDAR\r\nVERSION:2.0\r\nEND:VCALENDAR\r\n',
      },
    });
    mailer.close();
    await testApp.mail.waitFor('robin@halvorsen-pike.example');

    const context = await env.newContext({ acceptDownloads: true });
    const page = await context.newPage();
    await signInWithPassword(page, admin.email, TEST_PASSWORD);
    await page.getByRole('heading', { level: 1, name: /Good to see you/ }).waitFor();
    await page.goto('/studio/mailbox');
    await page.getByText('From').first().waitFor();
    await page.getByText('"Northlight Portrait Co." <bookings@northlight.example>').waitFor();

    // The formatted part, with the image that was sent inside it.
    const frame = page.frameLocator('iframe[title="Formatted message"]');
    await frame.getByRole('heading', { name: 'Hello Robin, in HTML' }).waitFor();
    await expect
      .poll(() => frame.locator('#pass').evaluate((image: HTMLImageElement) => image.naturalWidth))
      .toBe(1);

    // The plain part is one click away.
    await page.getByRole('button', { name: 'Plain text' }).click();
    await page.getByText('Hello Robin, you are booked.').waitFor();

    const attachments = page.getByRole('region', { name: 'Attachments' });
    await attachments.getByRole('img', { name: 'Preview of pass.png' }).waitFor();
    const [download] = await Promise.all([
      page.waitForEvent('download'),
      attachments.getByRole('link', { name: 'invite.ics' }).click(),
    ]);
    expect(download.suggestedFilename()).toBe('invite.ics');
    expect(await seriousAxeViolations(page)).toEqual([]);
    await context.close();
  });
});
