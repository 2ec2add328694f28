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
// field, an e-mail column whose header no synonym knows, a bad address, a missing name and a
// repeated person.
const messyFile =
  '\uFEFF' +
  [
    'Given Name;Surname;Contact;Emp #;Dept.;Site',
    'Zoë;Lindqvist;zoe.lindqvist@hp.example;HP-101;"Design; Interiors";Rotterdam',
    'Tomás;Ferreira;TOMAS.FERREIRA@hp.example ;HP-102;Structures;Porto',
    'Aled;Price;aled.price@hp.example;HP-103;Civil;Leeds',
    'Nora;Quinn;nora.quinn(at)hp.example;HP-104;Civil;Leeds',
    ';Okafor;obi.okafor@hp.example;HP-105;Finance;Leeds',
    'Aled;Price;aled.price@hp.example;HP-106;Civil;Leeds',
  ].join('\r\n');

describe('roster import in the browser', () => {
  it('a coordinator uploads a messy file, fixes a mapping, sees the errors, commits and finds a person', async () => {
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

    // The e-mail column was not recognised: the wizard says so, and the coordinator fixes it.
    const mapping = page.getByRole('form', { name: 'Match the columns' });
    await mapping.getByText('Choose the column that holds the work e-mail.').waitFor();
    expect(await mapping.getByLabel('Site').inputValue()).toBe('office');
    await mapping.getByLabel('Contact').selectOption('email');
    expect(await seriousAxeViolations(page)).toEqual([]);
    await mapping.getByRole('button', { name: 'Check the rows' }).click();

    // The preview opens on the rows in error, with a reason per cell.
    await page.getByRole('button', { name: 'In error: 3' }).waitFor();
    await page.getByRole('button', { name: 'To add: 3' }).waitFor();
    const table = page.getByRole('table', { name: /Preview/ });
    await table.getByText('Enter a valid e-mail address, like name@example.com.').waitFor();
    await table.getByText('Enter the given name.').waitFor();
    await table.getByText('The same e-mail is on row 4.').waitFor();
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
    await page.getByRole('link', { name: 'Import a staff list (CSV)' }).click();
    const newer = messyFile
      .replace('"Design; Interiors"', 'Lighting')
      .split('\r\n')
      .filter((line) => !line.startsWith('Aled'))
      .join('\r\n');
    await page.getByLabel('Staff list (CSV file)').setInputFiles({
      name: 'hr-export-2.csv',
      mimeType: 'text/csv',
      buffer: Buffer.from(newer, 'utf8'),
    });
    await page.getByRole('button', { name: 'To update: 1' }).waitFor();
    await page.getByRole('button', { name: 'Not in the file: 1' }).click();
    await page
      .getByRole('table', { name: /Preview/ })
      .getByText('aled.price@hp.example')
      .waitFor();
    await page.getByRole('button', { name: 'Save 2 changes to the roster' }).click();
    await page.getByText('1 updated, 1 marked inactive').waitFor();

    const rows = await env.testApp.db
      .selectFrom('people')
      .select(['email', 'active', 'department'])
      .where('clientId', '=', clientId)
      .orderBy('email')
      .execute();
    expect(rows).toEqual([
      { email: 'aled.price@hp.example', active: false, department: 'Civil' },
      { email: 'tomas.ferreira@hp.example', active: true, department: 'Structures' },
      { email: 'zoe.lindqvist@hp.example', active: true, department: 'Lighting' },
    ]);
    await context.close();
  });
});
