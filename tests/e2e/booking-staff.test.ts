import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import {
  insertClient,
  insertOffice,
  insertPerson,
  insertStaff,
  TEST_PASSWORD,
} from '../factories/accounts';
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

describe('the studio plans a day', () => {
  it('fills the day form with the planner, opens the day and queues the invitations', async () => {
    const t = env.testApp;
    const client = await insertClient(t.db, { name: 'Halvorsen & Pike Engineering' });
    const office = await insertOffice(t.db, client.id, 'Porto', 'Europe/Lisbon');
    for (let index = 0; index < 3; index += 1) {
      await insertPerson(t.db, client.id, { officeId: office.id });
    }
    const photographer = await insertStaff(t.db, { role: 'photographer' });
    const admin = await insertStaff(t.db);
    const context = await env.newContext();
    const page = await context.newPage();
    await signInWithPassword(page, admin.email, TEST_PASSWORD);
    await page
      .getByRole('navigation', { name: 'Main' })
      .getByRole('link', { name: 'Shoot days' })
      .click();
    await page.getByRole('heading', { level: 1, name: 'Shoot days' }).waitFor();
    await page.getByText('No shoot days yet').waitFor();
    expect(await seriousAxeViolations(page)).toEqual([]);

    const form = page.getByRole('form', { name: 'Plan a shoot day' });
    // The planner states the trade figures it uses.
    await form.getByText('common practice', { exact: false }).waitFor();
    await form.getByRole('button', { name: 'Create the day' }).click();
    await form.getByText('Pick the date of the day.').waitFor();

    await form.getByLabel('Date', { exact: true }).fill('2030-05-07');
    await form.getByLabel('Address').fill('Rua da Lanterna Velha 14, Porto');
    await form.getByLabel('Booking opens').fill('2030-04-01T09:00');
    await form.getByLabel('Booking closes').fill('2030-05-06T17:00');
    await form.getByLabel('Sitters can change until').fill('2030-05-06T17:00');
    await form.getByLabel('Station 1 photographer').selectOption(photographer.id);
    await form.getByRole('button', { name: 'Create the day' }).click();
    await form.getByText('The Porto day on 2030-05-07 is set up.').waitFor();

    await page
      .getByRole('link', { name: /2030-05-07 · Halvorsen & Pike Engineering · Porto/ })
      .click();
    await page.getByRole('heading', { level: 1, name: 'Porto · 2030-05-07' }).waitFor();
    // Nobody is invited before the invitations are sent (invited means mailed).
    await page.getByRole('img', { name: /^By office\. Porto: 0 invited, 0 booked/ }).waitFor();
    expect(await seriousAxeViolations(page)).toEqual([]);
    await page.getByRole('button', { name: 'Send invitations' }).click();
    await page.getByText('3 queued').waitFor();
    await page.getByText('Sending: 0 of 3 handled', { exact: false }).waitFor();
    // The log names each state in words (Waiting / Sent / Failed), not the stored value.
    const mailLog = page.getByRole('table', { name: 'Per-person mail log' });
    await mailLog.getByRole('cell', { name: 'Waiting', exact: true }).first().waitFor();
    expect(await mailLog.getByText('queued', { exact: true }).count()).toBe(0);

    // The studio books someone on their behalf, then moves and cancels that booking.
    const bookFor = page.getByRole('form', { name: 'Book for someone' });
    const firstPerson = await bookFor
      .getByLabel('Person')
      .locator('option')
      .nth(1)
      .getAttribute('value');
    await bookFor.getByLabel('Person').selectOption(firstPerson ?? '');
    await bookFor.getByRole('radio', { name: '09:00' }).check({ force: true });
    await bookFor.getByRole('button', { name: 'Book for them' }).click();
    await bookFor.getByText(/^Booked .* at 09:00/).waitFor();

    const bookings = page.getByRole('list', { name: 'Bookings' });
    await bookings.getByRole('button', { name: 'Move' }).click();
    const moveForm = bookings.getByRole('form', { name: /^Move / });
    await moveForm.getByRole('radio', { name: '09:30' }).check({ force: true });
    await moveForm.getByRole('button', { name: 'Move to this time' }).click();
    await bookings.getByText('09:30', { exact: true }).waitFor();
    expect(await seriousAxeViolations(page)).toEqual([]);

    await bookings.getByRole('button', { name: 'Cancel booking' }).click();
    await bookings.getByRole('button', { name: 'Yes, cancel it' }).click();
    await page.getByText('Nobody has booked yet').waitFor();
    await context.close();
  });
});
