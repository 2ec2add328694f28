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
let coordinatorEmail: string;
const emails: string[] = [];
beforeAll(async () => {
  env = await startE2e();
  const db = env.testApp.db;
  const client = await insertClient(db, { name: 'Halvorsen & Pike Engineering' });
  const offices = [
    await insertOffice(db, client.id, 'Leeds', 'Europe/London'),
    await insertOffice(db, client.id, 'Porto', 'Europe/Lisbon'),
  ];
  coordinatorEmail = (await insertStaff(db, { role: 'coordinator', clientId: client.id })).email;
  const givenNames = ['Ines', 'Bram', 'Odile', 'Tamsin', 'Joao', 'Wiebke', 'Colm', 'Fenna'];
  for (let index = 0; index < 24; index += 1) {
    const email = `${String.fromCharCode(97 + ((index * 7) % 24))}.person${index}@halvorsen-pike.example`;
    emails.push(email);
    const person = await insertPerson(db, client.id, {
      email,
      officeId: offices[index % 2]!.id,
      givenName: givenNames[index % givenNames.length],
    });
    await db
      .updateTable('people')
      .set({ department: index % 3 === 0 ? 'Structural design' : 'Finance and procurement' })
      .where('id', '=', person.id)
      .execute();
  }
});
afterAll(() => env?.close());

describe('people directory', () => {
  it('shows one compact row per person, sorts by its columns, and marks the People tab', async () => {
    const context = await env.newContext({ viewport: { width: 1366, height: 768 } });
    const page = await context.newPage();
    await signInWithPassword(page, coordinatorEmail, TEST_PASSWORD);
    await page.getByRole('heading', { level: 1, name: /Welcome,/ }).waitFor();
    await page
      .getByRole('navigation', { name: 'Main' })
      .getByRole('link', { name: 'People' })
      .click();
    await page.getByRole('heading', { level: 1, name: 'People' }).waitFor();

    // The menu shows where the coordinator is, though /people redirects to the client's page.
    const menu = page.getByRole('navigation', { name: 'Main' });
    expect(await menu.getByRole('link', { name: 'People' }).getAttribute('aria-current')).toBe(
      'page',
    );
    expect(await menu.getByRole('link', { name: 'Shoot days' }).getAttribute('aria-current')).toBe(
      null,
    );

    const table = page.getByRole('table', { name: 'People' });
    const rows = table.locator('tbody tr');
    await rows.nth(23).waitFor();
    // One line each: no taller than one 44 px control plus a little padding.
    const heights = await rows.evaluateAll((elements) =>
      elements.map((element) => element.getBoundingClientRect().height),
    );
    expect(heights).toHaveLength(24);
    expect(Math.max(...heights)).toBeLessThanOrEqual(52);

    const firstEmail = () => rows.first().locator('td').nth(2).innerText();
    const sorted = [...emails].sort();
    const header = table.getByRole('columnheader', { name: /Work e-mail/ });
    await header.getByRole('button').click();
    await table.locator('th[aria-sort="ascending"]', { hasText: 'Work e-mail' }).waitFor();
    await expect.poll(firstEmail).toBe(sorted[0]);
    await header.getByRole('button').click();
    await table.locator('th[aria-sort="descending"]', { hasText: 'Work e-mail' }).waitFor();
    await expect.poll(firstEmail).toBe(sorted.at(-1));

    await table
      .getByRole('columnheader', { name: /Office/ })
      .getByRole('button')
      .click();
    await table.locator('th[aria-sort="ascending"]', { hasText: 'Office' }).waitFor();
    await expect.poll(() => rows.first().locator('td').nth(6).innerText()).toBe('Leeds');
    expect(await seriousAxeViolations(page)).toEqual([]);

    // A row's actions sit beside its name, on screen without scrolling sideways; the form a
    // row opens comes into view, and deactivating says what happened.
    const last = rows.nth(23);
    const edit = last.getByRole('button', { name: /^Edit / });
    const box = await edit.boundingBox();
    expect(box!.x + box!.width).toBeLessThanOrEqual(1366);
    await edit.click();
    const form = page.getByRole('heading', { name: 'Edit a person' });
    await form.waitFor();
    await expect
      .poll(() => form.evaluate((element) => element.getBoundingClientRect().top))
      .toBeLessThan(768);
    await page.getByRole('button', { name: 'Cancel' }).click();
    await last.getByRole('button', { name: /^Deactivate / }).click();
    await page.getByText(/is inactive now: listed under Status/).waitFor();
    await context.close();
  });
});
