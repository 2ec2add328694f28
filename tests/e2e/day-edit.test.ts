import ICAL from 'ical.js';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import {
  insertClient,
  insertOffice,
  insertPerson,
  insertStaff,
  TEST_PASSWORD,
} from '../factories/accounts';
import { insertDay } from '../factories/days';
import { runQueuedJobs } from '../server/booking-jobs';
import { signedInAgent } from '../server/helpers';
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

describe('editing a day in the browser', () => {
  it('lists the booking a shorter day no longer fits, moves it, and the sitter’s invitation raises SEQUENCE', async () => {
    const t = env.testApp;
    const client = await insertClient(t.db, { name: 'Halvorsen & Pike Engineering' });
    const office = await insertOffice(t.db, client.id, 'Leeds', 'Europe/London');
    const photographer = await insertStaff(t.db, { role: 'photographer' });
    const day = await insertDay(t.db, {
      clientId: client.id,
      officeId: office.id,
      photographerIds: [photographer.id],
    });
    const sitter = await insertPerson(t.db, client.id, { officeId: office.id, givenName: 'Ilse' });
    const admin = await insertStaff(t.db);
    const api = await signedInAgent(t, admin.email);
    await api
      .post('/api/bookings')
      .send({ dayId: day.id, personId: sitter.id, startsAt: `${day.date}T11:30:00.000Z` })
      .expect(201);
    await runQueuedJobs(t);
    t.mail.clear();

    const context = await env.newContext();
    const page = await context.newPage();
    await signInWithPassword(page, admin.email, TEST_PASSWORD);
    await page.getByRole('navigation', { name: 'Main' }).waitFor();
    await page.goto(`/days/${day.id}`);
    const form = page.getByRole('form', { name: 'Change this day' });
    await form.getByText('Every time here is Europe/London time', { exact: false }).waitFor();
    await form.getByLabel('Closes', { exact: true }).fill('11:00');
    await form.getByRole('button', { name: 'Check what this changes' }).click();
    const affected = form.getByRole('list', { name: 'Bookings that no longer fit' });
    await affected
      .getByText(
        /Ilse .*: 11:30 at Station A \(outside the new hours\) → moves to 10:55 at Station A/,
      )
      .waitFor();
    expect(await seriousAxeViolations(page)).toEqual([]);
    // Nothing is saved by looking.
    const before = await api.get(`/api/days/${day.id}`).expect(200);
    expect(before.body.closesAt).toBe('12:00');

    await form.getByRole('button', { name: 'Save the changes' }).click();
    await form.getByText('Saved. The sitters affected are being told by e-mail.').waitFor();
    await page.getByText('09:00–11:00', { exact: false }).first().waitFor();

    await runQueuedJobs(t);
    const mail = await t.mail.waitFor(sitter.email, { subjectIncludes: 'has moved' });
    const part = mail.attachments.find((item) => item.contentType.startsWith('text/calendar'));
    const calendar = new ICAL.Component(
      ICAL.parse(Buffer.from(part!.content, 'base64').toString('utf8')),
    );
    // No reply address is set here, so the update is published (RFC 5546 3.2.1) rather than
    // requested; either way it keeps the UID and raises SEQUENCE (0 at booking).
    expect(calendar.getFirstPropertyValue('method')).toBe('PUBLISH');
    const event = calendar.getFirstSubcomponent('vevent')!;
    expect(event.getFirstPropertyValue('sequence')).toBe(1);
    expect(mail.text).toContain('10:55 (Europe/London');
    await context.close();
  });

  it('reads every date-time on the day form in the office zone, not the browser’s', async () => {
    const t = env.testApp;
    const client = await insertClient(t.db);
    const office = await insertOffice(t.db, client.id, 'Hamburg', 'Europe/Berlin');
    const photographer = await insertStaff(t.db, { role: 'photographer' });
    const admin = await insertStaff(t.db);
    // A browser on UTC plans a day in Hamburg.
    const context = await env.newContext({ timezoneId: 'UTC' });
    const page = await context.newPage();
    await signInWithPassword(page, admin.email, TEST_PASSWORD);
    await page.getByRole('navigation', { name: 'Main' }).waitFor();
    await page.goto('/days');
    const form = page.getByRole('form', { name: 'Plan a shoot day' });
    if ((await form.getByLabel('Client').count()) > 0) {
      await form.getByLabel('Client').selectOption(client.id);
    }
    await form.getByLabel('Office').selectOption(office.id);
    await form.getByLabel('Date', { exact: true }).fill('2030-01-15');
    await form.getByLabel('Address').fill('Kranhöft 9, Hamburg');
    await form.getByLabel('Booking opens (Europe/Berlin)').fill('2030-01-02T09:00');
    await form.getByLabel('Booking closes (Europe/Berlin)').fill('2030-01-14T18:00');
    await form.getByLabel('Sitters can change until (Europe/Berlin)').fill('2030-01-14T18:00');
    await form.getByLabel('Station 1 photographer').selectOption(photographer.id);
    await form.getByRole('button', { name: 'Create the day' }).click();
    await form.getByText('The Hamburg day on 2030-01-15 is set up.').waitFor();
    const stored = await t.db
      .selectFrom('shootDays')
      .select(['bookingClosesAt', 'changesCloseAt'])
      .where('officeId', '=', office.id)
      .executeTakeFirstOrThrow();
    // 18:00 in Hamburg in January is 17:00 UTC (CET, UTC+01:00; IANA Europe/Berlin, from memory).
    expect(stored.bookingClosesAt.toISOString()).toBe('2030-01-14T17:00:00.000Z');
    expect(stored.changesCloseAt.toISOString()).toBe('2030-01-14T17:00:00.000Z');
    await context.close();
  });
});
