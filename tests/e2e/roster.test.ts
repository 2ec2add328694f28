import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { insertClient, insertOffice, insertStaff, TEST_PASSWORD } from '../factories/accounts';
import {
  seriousAxeViolations,
  signInWithPassword,
  startE2e,
  type E2eEnvironment,
} from './support/browser';

let env: E2eEnvironment;
let clientId: string;
beforeAll(async () => {
  env = await startE2e();
  clientId = (await insertClient(env.testApp.db, { name: 'Halvorsen & Pike Engineering' })).id;
  await insertOffice(env.testApp.db, clientId, 'Leeds', 'Europe/London');
});
afterAll(() => env?.close());

// A messy HR export (invented people): UTF-8 with BOM, ";" separators, a quoted ";" inside a
// field, an e-mail column whose header no synonym knows (guessed from its addresses), an id
// column no synonym knows, a bad address, a missing name, a missing e-mail and a repeated person.
const messyFile =
  '\uFEFF' +
  [
    'Given Name;Surname;Contact;Ref;Dept.;Site',
    'Zoë;Lindqvist;zoe.lindqvist@hp.example;HP-101;"Design; Interiors";Rotterdam',
    'Tomás;Ferreira;TOMAS.FERREIRA@hp.example ;HP-102;Structures;Porto',
    'Aled;Price;aled.price@hp.example;HP-103;Civil;Leeds',
    'Nora;Quinn;nora.quinn(at)hp.example;HP-104;Civil;Leeds',
    ';Okafor;obi.okafor@hp.example;HP-105;Finance;Leeds',
    'Aled;Price;aled.price@hp.example;HP-106;Civil;Leeds',
    'Ivo;Marsh;;HP-107;Civil;Leeds',
  ].join('\r\n');

describe('roster import in the browser', () => {
  it('a coordinator uploads a messy file, fixes a mapping, sees the errors, commits and finds a person; a re-import shows a conflict, counts that agree with the table and deactivation off until ticked', async () => {
    const coordinator = await insertStaff(env.testApp.db, { role: 'coordinator', clientId });
    const context = await env.newContext();
    const page = await context.newPage();
    await signInWithPassword(page, coordinator.email, TEST_PASSWORD);
    await page.getByRole('heading', { level: 1, name: /Welcome,/ }).waitFor();
    await page.getByRole('link', { name: 'Import the staff list (CSV)' }).click();
    await page.getByRole('heading', { level: 1, name: 'Import the staff list' }).waitFor();
    expect(await seriousAxeViolations(page)).toEqual([]);

    await page.getByLabel('Staff list (CSV file)').setInputFiles({
      name: 'hr-export.csv',
      mimeType: 'text/csv',
      buffer: Buffer.from(messyFile, 'utf8'),
    });

    // "Contact" holds addresses, so it is taken for the e-mail; the coordinator names the id.
    const mapping = page.getByRole('form', { name: 'Match the columns' });
    await mapping.getByLabel('Site').waitFor();
    expect(await mapping.getByLabel('Site').inputValue()).toBe('office');
    expect(await mapping.getByLabel('Contact').inputValue()).toBe('email');
    await mapping
      .getByText(/chosen from the values, as the header names no field: check it/)
      .waitFor();
    expect(await mapping.getByLabel('Ref').inputValue()).toBe('extra');
    await mapping.getByLabel('Ref').selectOption('employeeId');
    expect(await seriousAxeViolations(page)).toEqual([]);
    await mapping.getByRole('button', { name: 'Check the rows' }).click();

    // The preview opens on the rows in error, with a reason per cell.
    await page.getByRole('button', { name: 'In error: 4' }).waitFor();
    await page.getByRole('button', { name: 'To add: 3' }).waitFor();
    const table = page.getByRole('table', { name: /Preview/ });
    await table.getByText('Enter a valid e-mail address, like name@example.com.').waitFor();
    await table.getByText('The given name is missing.').waitFor();
    await table.getByText('The same e-mail is on row 4.').waitFor();
    await table.getByText('The e-mail is missing.').waitFor();
    await page.getByRole('link', { name: 'Download the rows to fix (CSV)' }).waitFor();

    // Current IANA names in the list (Europe/Kyiv), not the retired ones ICU still lists.
    const porto = page.getByLabel('Time zone of Porto');
    expect(await porto.locator('option[value="Europe/Kyiv"]').count()).toBe(1);
    expect(await porto.locator('option[value="Europe/Kiev"]').count()).toBe(0);
    expect(await porto.locator('option[value="Asia/Kolkata"]').count()).toBe(1);
    await page.getByLabel('Time zone of Porto').selectOption('Europe/Lisbon');
    await page.getByLabel('Time zone of Rotterdam').selectOption('Europe/Amsterdam');
    expect(await seriousAxeViolations(page)).toEqual([]);
    await page.getByRole('button', { name: 'Save 3 changes to the roster' }).click();
    await page.getByText('The roster is up to date.').waitFor();

    await page.getByRole('link', { name: 'See the people' }).click();
    await page.getByRole('heading', { level: 1, name: 'People' }).waitFor();
    await page.getByLabel('Search by name, e-mail or id').fill('Lindq');
    const people = page.getByRole('table', { name: 'People' });
    await people.getByRole('cell', { name: 'zoe.lindqvist@hp.example' }).waitFor();
    await people.getByRole('cell', { name: 'Design; Interiors' }).waitFor();
    await page.getByText('Rows 1–1 of 1').waitFor();
    expect(await seriousAxeViolations(page)).toEqual([]);

    // A newer export with the same columns skips the mapping: the last one is remembered.
    // Aled has left; Tomás comes with another person's kind of id: a conflict, not an update.
    await page.getByRole('link', { name: 'Import a staff list (CSV)' }).click();
    const newer = messyFile
      // A stray NUL, as some exports leave: removed with a warning on the row.
      .replace('"Design; Interiors"', 'Light\u0000ing')
      .replace('HP-102', 'HP-902')
      .split('\r\n')
      .filter((line) => !line.startsWith('Aled'))
      .join('\r\n');
    await page.getByLabel('Staff list (CSV file)').setInputFiles({
      name: 'hr-export-2.csv',
      mimeType: 'text/csv',
      buffer: Buffer.from(newer, 'utf8'),
    });
    await page.getByRole('button', { name: 'To update: 1' }).waitFor();
    await page.getByRole('button', { name: 'Same e-mail, other id: 1' }).click();
    const preview = page.getByRole('table', { name: /Preview/ });
    await preview
      .getByText(/belongs to Tomás Ferreira, whose employee id is HP-102; this row says HP-902/)
      .waitFor();
    await page.getByText(/^1 row has the e-mail of someone on the roster/).waitFor();
    const sameIds = page.getByLabel(/^The row with the same e-mail and another id is the same/);
    expect(await sameIds.isChecked()).toBe(false);

    await page.getByText('1 row comes with a warning').waitFor();
    await page.getByRole('button', { name: 'Show them' }).click();
    await page
      .getByRole('table', { name: 'Preview: rows with a warning' })
      .getByText('A control character (not allowed in text) was removed from this value.')
      .waitFor();

    // "All rows" counts what its table pages: 5 rows of the file and 1 person not in it.
    await page.getByRole('button', { name: 'All rows: 6' }).click();
    await page.getByText('Rows 1–6 of 6').waitFor();

    // Nobody is marked inactive unless asked; ticking the box shows who.
    const deactivate = page.getByLabel(/Mark the 1 people who are not in this file as inactive/);
    expect(await deactivate.isChecked()).toBe(false);
    await page.getByRole('button', { name: 'Save 1 change to the roster' }).waitFor();
    expect(await page.getByRole('table', { name: 'People to mark inactive' }).count()).toBe(0);
    await deactivate.check();
    await page
      .getByRole('table', { name: 'People to mark inactive' })
      .getByText('aled.price@hp.example')
      .waitFor();
    expect(await seriousAxeViolations(page)).toEqual([]);
    await page.getByRole('button', { name: 'Save 2 changes to the roster' }).click();
    await page.getByText('1 updated, 1 marked inactive, 4 rows left out').waitFor();

    const rows = await env.testApp.db
      .selectFrom('people')
      .select(['email', 'active', 'department', 'employeeId'])
      .where('clientId', '=', clientId)
      .orderBy('email')
      .execute();
    expect(rows).toEqual([
      { email: 'aled.price@hp.example', active: false, department: 'Civil', employeeId: 'HP-103' },
      {
        email: 'tomas.ferreira@hp.example',
        active: true,
        department: 'Structures',
        employeeId: 'HP-102',
      },
      {
        email: 'zoe.lindqvist@hp.example',
        active: true,
        department: 'Lighting',
        employeeId: 'HP-101',
      },
    ]);
    await context.close();
  });
  it('a column choice changed and then changed back is checked again, not kept from the check before', async () => {
    const otherClient = await insertClient(env.testApp.db, { name: 'Aldermoor Housing Trust' });
    const coordinator = await insertStaff(env.testApp.db, {
      role: 'coordinator',
      clientId: otherClient.id,
    });
    const context = await env.newContext();
    const page = await context.newPage();
    await signInWithPassword(page, coordinator.email, TEST_PASSWORD);
    await page.getByRole('heading', { level: 1, name: /Welcome,/ }).waitFor();
    await page.goto(`/clients/${otherClient.id}/people/import`);
    await page.getByLabel('Staff list (CSV file)').setInputFiles({
      name: 'york.csv',
      mimeType: 'text/csv',
      buffer: Buffer.from(
        'First name;Last name;E-mail\r\nIvy;Marlow;ivy.marlow@ah.example\r\nRex;Dunmore;rex.dunmore@ah.example\r\n',
      ),
    });
    const mapping = page.getByRole('form', { name: 'Match the columns' });
    await mapping.getByLabel('E-mail').selectOption('ignore');
    await mapping.getByRole('button', { name: 'Check the rows' }).click();
    await mapping.getByText('Choose the column that holds the work e-mail.').waitFor();
    await mapping.getByLabel('E-mail').selectOption('email');
    await mapping.getByRole('button', { name: 'Check the rows' }).click();

    const table = page.getByRole('table', { name: /Preview/ });
    await table.getByText('ivy.marlow@ah.example').waitFor();
    await page.getByRole('button', { name: 'Save 2 changes to the roster' }).click();
    await page.getByText('The roster is up to date.').waitFor();

    // Another company's import page is not shown to this coordinator.
    await page.goto(`/clients/${clientId}/people/import`);
    await page.getByRole('heading', { level: 1, name: 'Page not found' }).waitFor();
    expect(await page.getByLabel('Staff list (CSV file)').count()).toBe(0);
    await context.close();
  });
});
