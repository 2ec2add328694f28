import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { TEST_PASSWORD } from '../factories/accounts';
import { consoleScenario } from './console-support';
import { signInWithPassword, startE2e, type E2eEnvironment } from './support/browser';

let env: E2eEnvironment;
let scenario: Awaited<ReturnType<typeof consoleScenario>>;
beforeAll(async () => {
  env = await startE2e();
  scenario = await consoleScenario(env.testApp, 6);
});
afterAll(() => env?.close());

async function openConsole() {
  const { day } = scenario;
  const context = await env.newContext({ viewport: { width: 1024, height: 768 }, hasTouch: true });
  const page = await context.newPage();
  await signInWithPassword(page, scenario.photographer.email, TEST_PASSWORD);
  await page.getByRole('heading', { level: 1, name: /Hello,/ }).waitFor();
  await page.goto(`/console/${day.id}/${day.stations[0]!.id}`);
  await page.getByRole('heading', { level: 1, name: 'Station A' }).waitFor();
  const row = (index: number) =>
    page.getByRole('listitem', { name: new RegExp(scenario.people[index]!.givenName) });
  return { context, page, row, sync: page.getByRole('status', { name: 'Sync' }) };
}

describe('station console: notices and undo', () => {
  it('shows one notice at a time over the queue, fades it, and keeps undo until the next change', async () => {
    const { context, page, row, sync } = await openConsole();
    const notices = page.getByRole('region', { name: 'Notices' });
    const queueTop = async () =>
      (await page.getByRole('list', { name: 'Sitters' }).boundingBox())!.y;
    const before = await queueTop();

    await row(0).getByRole('button', { name: 'Check in' }).click();
    await notices.getByText(/Aino .* is checked in\./).waitFor();
    // The notice lies over the page: the queue does not move down.
    expect(await queueTop()).toBe(before);

    await row(1).getByRole('button', { name: 'Check in' }).click();
    await notices.getByText(/Bram .* is checked in\./).waitFor();
    // The newer notice replaced the older one instead of stacking under it.
    expect(await notices.getByRole('status').count()).toBe(1);
    await sync.getByText('All changes saved').waitFor();

    // Undo outlives the old eight seconds: it is offered until the next change.
    await notices.getByRole('status').waitFor({ state: 'hidden' });
    await page.waitForTimeout(9000);
    await page.getByText(/Just recorded: check in Bram/).waitFor();
    await row(2).getByRole('button', { name: 'Check in' }).click();
    await page.getByText(/Just recorded: check in Carla/).waitFor();
    expect(await page.getByText(/Just recorded: check in Bram/).count()).toBe(0);
    await page.getByRole('button', { name: 'Undo' }).click();
    await row(2).getByText('Booked', { exact: true }).waitFor();
    await sync.getByText('All changes saved').waitFor();
    await context.close();
  });
});

describe('station console: a refused change', () => {
  it('sets aside a change the server refuses or keeps failing on, shows it, and sends the rest', async () => {
    const { context, page, row, sync } = await openConsole();
    const [, , , dries, edda, femke] = scenario.people;
    // The server answers one change 500 every time and refuses another with 422; the rest pass.
    await page.route('**/api/days/*/console/actions', async (route) => {
      const body = route.request().postData() ?? '';
      if (body.includes(dries!.id)) {
        await route.fulfill({
          status: 500,
          json: { error: { code: 'internal', message: 'Something went wrong.' } },
        });
      } else if (body.includes(edda!.id)) {
        await route.fulfill({
          status: 422,
          json: {
            error: { code: 'invalid_input', message: 'The name has a character we cannot store.' },
          },
        });
      } else {
        await route.continue();
      }
    });
    await row(3).getByRole('button', { name: 'Check in' }).click();
    await row(4).getByRole('button', { name: 'Check in' }).click();
    await row(5).getByRole('button', { name: 'Check in' }).click();

    const aside = page.getByRole('region', { name: 'Changes set aside' });
    await aside
      .getByText(/check in Dries .*: the server could not save it \(error 500\)/)
      .waitFor({ timeout: 30_000 });
    await aside.getByText(/check in Edda .*: The name has a character we cannot store\./).waitFor();
    // The change recorded after both still reached the server.
    await row(5).getByText('Arrived', { exact: true }).waitFor();
    await sync.getByText('All changes saved').waitFor();
    const checkIns = await env.testApp.db.selectFrom('checkIns').select('personId').execute();
    expect(checkIns.map((item) => item.personId)).toContain(femke!.id);
    expect(checkIns.map((item) => item.personId)).not.toContain(dries!.id);
    // Set aside is not shown as done in the queue.
    await row(3).getByText('Booked', { exact: true }).waitFor();

    // Kept across a reload, until the photographer decides.
    await page.reload();
    await aside.getByText(/check in Edda/).waitFor();
    await page.unroute('**/api/days/*/console/actions');
    await aside
      .getByRole('listitem')
      .filter({ hasText: 'Dries' })
      .getByRole('button', { name: 'Send again' })
      .click();
    await row(3).getByText('Arrived', { exact: true }).waitFor();
    await aside
      .getByRole('listitem')
      .filter({ hasText: 'Edda' })
      .getByRole('button', { name: 'Discard' })
      .click();
    await aside.waitFor({ state: 'detached' });
    await sync.getByText('All changes saved').waitFor();
    const after = await env.testApp.db.selectFrom('checkIns').select('personId').execute();
    expect(after.map((item) => item.personId)).toContain(dries!.id);
    expect(after.map((item) => item.personId)).not.toContain(edda!.id);
    await context.close();
  });
});

describe('station console: search', () => {
  it('finds people without their accents and by employee id', async () => {
    await env.testApp.db
      .insertInto('people')
      .values({
        clientId: scenario.client.id,
        officeId: scenario.office.id,
        givenName: 'Zoë',
        familyName: 'Müller',
        email: 'zoe.muller@halvorsen-pike.example',
        employeeId: 'HP-77310',
      })
      .execute();
    const { context, page } = await openConsole();
    await page.getByRole('button', { name: 'Check in', exact: true }).first().click();
    await page.getByRole('tab', { name: 'Search by name' }).click();
    const field = page.getByLabel('Name or employee id');
    const matches = page.getByRole('list', { name: 'Matches' });
    await field.fill('zoe muller');
    await matches.getByText('Zoë Müller').waitFor();
    await field.fill('77310');
    await matches.getByText('Zoë Müller').waitFor();
    await matches.getByText(/HP-77310/).waitFor();
    await context.close();
  });
});
