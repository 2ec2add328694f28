import { readFile } from 'node:fs/promises';
import ICAL from 'ical.js';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { insertClient, insertOffice, insertPerson, insertStaff } from '../factories/accounts';
import { insertDay } from '../factories/days';
import { runQueuedJobs } from '../server/booking-jobs';
import { signedInAgent } from '../server/helpers';
import { seriousAxeViolations, startE2e, type E2eEnvironment } from './support/browser';

let env: E2eEnvironment;
beforeAll(async () => {
  env = await startE2e();
});
afterAll(() => env?.close());

describe('a sitter books on a phone', () => {
  it('opens the invitation, books, sees the pass, moves, and gets the updated invitation', async () => {
    const t = env.testApp;
    const client = await insertClient(t.db, { name: 'Halvorsen & Pike Engineering' });
    const office = await insertOffice(t.db, client.id, 'Leeds', 'Europe/London');
    const photographer = await insertStaff(t.db, { role: 'photographer' });
    const day = await insertDay(t.db, {
      clientId: client.id,
      officeId: office.id,
      photographerIds: [photographer.id],
      opensAt: '09:00',
      closesAt: '11:00',
    });
    const person = await insertPerson(t.db, client.id, { officeId: office.id, givenName: 'Ines' });
    const admin = await signedInAgent(t, (await insertStaff(t.db)).email);
    await admin.post(`/api/days/${day.id}/invitations`).expect(202);
    const runJobs = () => runQueuedJobs(t);
    await runJobs();

    const invitation = await t.mail.waitFor(person.email, {
      subjectIncludes: 'Book your portrait',
    });
    const url = /(http:\/\/\S+\/link\/\S+)/.exec(invitation.text)?.[1];
    expect(url).toBeDefined();

    const context = await env.newContext({
      viewport: { width: 390, height: 844 },
      isMobile: true,
      hasTouch: true,
      acceptDownloads: true,
    });
    const page = await context.newPage();
    await page.goto(url as string);
    await page.getByRole('heading', { level: 1, name: 'Hello, Ines' }).waitFor();
    const form = page.getByRole('form', { name: 'Book a slot' });
    await form.getByText('Europe/London time', { exact: false }).waitFor();
    expect(await seriousAxeViolations(page)).toEqual([]);

    await form.getByText('09:15', { exact: true }).click();
    await form.getByLabel('Flash photography is a problem for me').check();
    await form.getByText('continuous light', { exact: false }).waitFor();
    await form.getByRole('button', { name: 'Book this time' }).click();

    await page.getByText('Booked for', { exact: false }).waitFor();
    await expect(page.locator('p', { hasText: 'Booked for' }).innerText()).resolves.toContain(
      '09:15',
    );
    const pass = page.getByRole('img', { name: /Your pass/ });
    await pass.waitFor();
    // The image may still be on its way when it appears: wait until it has really loaded.
    await pass.evaluate((img: HTMLImageElement) =>
      img.complete && img.naturalWidth > 0
        ? true
        : new Promise<boolean>((resolve, reject) => {
            img.addEventListener('load', () => resolve(img.naturalWidth > 0), { once: true });
            img.addEventListener(
              'error',
              () => reject(new Error('The pass image failed to load')),
              {
                once: true,
              },
            );
          }),
    );
    expect(await pass.evaluate((img: HTMLImageElement) => img.naturalWidth)).toBeGreaterThan(0);
    expect(await seriousAxeViolations(page)).toEqual([]);
    // Confirmations go out from the job queue; run it as the worker would.
    await runJobs();
    await t.mail.waitFor(person.email, { subjectIncludes: 'is booked' });

    await page.getByRole('button', { name: 'Move my sitting' }).click();
    const move = page.getByRole('form', { name: 'Move my sitting' });
    await move.getByText('10:00', { exact: true }).click();
    await move.getByRole('button', { name: 'Move to this time' }).click();
    const movedNotice = page.getByText(
      'Moved to 10:00. An updated calendar invitation is on its way.',
    );
    await movedNotice.waitFor();
    // The confirmation is where the sitter is looking, not above the top of the phone's screen.
    await expect
      .poll(() =>
        movedNotice.evaluate((element) => {
          const box = element.getBoundingClientRect();
          return box.top >= 0 && box.bottom <= window.innerHeight;
        }),
      )
      .toBe(true);
    await expect(page.locator('p', { hasText: 'Booked for' }).innerText()).resolves.toContain(
      '10:00',
    );

    // The catcher holds the updated invitation: same UID, SEQUENCE raised (RFC 5546).
    await runJobs();
    const moved = await t.mail.waitFor(person.email, { subjectIncludes: 'has moved' });
    const part = moved.attachments.find((item) => item.contentType.startsWith('text/calendar'));
    const calendar = new ICAL.Component(
      ICAL.parse(Buffer.from(part!.content, 'base64').toString('utf8')),
    );
    const vevent = calendar.getFirstSubcomponent('vevent')!;
    // No reply address is set here, so the entry asks for no reply (RFC 5546 PUBLISH).
    expect(calendar.getFirstPropertyValue('method')).toBe('PUBLISH');
    expect(vevent.getFirstPropertyValue('sequence')).toBe(1);
    expect(vevent.getFirstProperty('dtstart')!.toICALString()).toBe(
      'DTSTART;TZID=Europe/London:20300314T100000',
    );

    // The same entry downloads from the page, read back with ical.js.
    const [download] = await Promise.all([
      page.waitForEvent('download'),
      page.getByRole('link', { name: /Add to my calendar/ }).click(),
    ]);
    expect(download.suggestedFilename()).toBe('portrait-sitting.ics');
    const file = new ICAL.Component(ICAL.parse(await readFile((await download.path())!, 'utf8')));
    const fileEvent = file.getFirstSubcomponent('vevent')!;
    expect(fileEvent.getFirstPropertyValue('uid')).toBe(vevent.getFirstPropertyValue('uid'));
    expect(fileEvent.getFirstProperty('dtstart')!.toICALString()).toBe(
      'DTSTART;TZID=Europe/London:20300314T100000',
    );

    // The answers given at booking can be read and changed.
    const answers = page.getByRole('region', { name: 'Your answers' });
    await answers.getByText('No flash: continuous light for this sitter').waitFor();
    await answers.getByRole('button', { name: 'Change my answers' }).click();
    const edit = page.getByRole('form', { name: 'Change my answers' });
    await edit.getByLabel('I wear glasses').check();
    await edit.getByLabel('Name to use on your photo files').fill('Inês');
    await edit.getByRole('button', { name: 'Save my answers' }).click();
    await answers.getByText('Your answers are saved.').waitFor();
    await answers.getByText('Inês', { exact: true }).waitFor();
    const row = await t.db
      .selectFrom('bookings')
      .select(['glasses', 'preferredName', 'flashSensitive', 'status'])
      .where('personId', '=', person.id)
      .executeTakeFirstOrThrow();
    expect(row).toEqual({
      glasses: true,
      preferredName: 'Inês',
      flashSensitive: true,
      status: 'active',
    });

    // Cancelling asks first; keeping it changes nothing.
    await page.getByRole('button', { name: 'Cancel my sitting' }).click();
    await page.getByText('Cancel your sitting at 10:00?').waitFor();
    await page.getByRole('button', { name: 'Keep it' }).click();
    await page.getByRole('button', { name: 'Cancel my sitting' }).click();
    await page.getByRole('button', { name: 'Yes, cancel it' }).click();
    await page.getByRole('form', { name: 'Book a slot' }).waitFor();
    const cancelled = await t.db
      .selectFrom('bookings')
      .select('status')
      .where('personId', '=', person.id)
      .executeTakeFirstOrThrow();
    expect(cancelled.status).toBe('cancelled');
    expect(await seriousAxeViolations(page)).toEqual([]);
    await context.close();
  });
});
