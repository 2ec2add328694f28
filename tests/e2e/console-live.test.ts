import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { TEST_PASSWORD } from '../factories/accounts';
import { consoleScenario } from './console-support';
import { signInWithPassword, startE2e, type E2eEnvironment } from './support/browser';

let env: E2eEnvironment;
let scenario: Awaited<ReturnType<typeof consoleScenario>>;
beforeAll(async () => {
  env = await startE2e();
  scenario = await consoleScenario(env.testApp, 3);
});
afterAll(() => env?.close());

async function tablet(stationPath: string) {
  const context = await env.newContext({ viewport: { width: 1024, height: 768 }, hasTouch: true });
  const page = await context.newPage();
  await signInWithPassword(page, scenario.photographer.email, TEST_PASSWORD);
  await page.getByRole('heading', { level: 1, name: /Hello,/ }).waitFor();
  await page.goto(stationPath);
  return { context, page };
}

describe('station console: several tablets', () => {
  it("two tablets see each other's check-in and its undo within 2 seconds", async () => {
    const { day } = scenario;
    const first = await tablet(`/console/${day.id}/${day.stations[0]!.id}`);
    const second = await tablet(`/console/${day.id}/${day.stations[1]!.id}`);
    await first.page.getByRole('heading', { level: 1, name: 'Station A' }).waitFor();
    await second.page.getByRole('heading', { level: 1, name: 'Station B' }).waitFor();
    // The second tablet follows the whole day, not only its own station's bookings.
    await second.page.getByRole('button', { name: 'All stations' }).click();

    const sitter = scenario.people[2]!;
    const rowOn = (page: typeof first.page) =>
      page.getByRole('listitem', { name: new RegExp(sitter.givenName) });
    await rowOn(second.page).getByText('Booked', { exact: true }).waitFor();
    // Let the second tablet's event stream connect before the change is made.
    await second.page.waitForTimeout(500);

    await rowOn(first.page).getByRole('button', { name: 'Check in' }).click();
    const clicked = Date.now();
    await rowOn(second.page).getByText('Arrived', { exact: true }).waitFor({ timeout: 2000 });
    expect(Date.now() - clicked).toBeLessThan(2000);

    // And the other way round.
    const other = scenario.people[1]!;
    await second.page
      .getByRole('listitem', { name: new RegExp(other.givenName) })
      .getByRole('button', { name: 'Check in' })
      .click();
    const back = Date.now();
    await first.page
      .getByRole('listitem', { name: new RegExp(other.givenName) })
      .getByText('Arrived', { exact: true })
      .waitFor({ timeout: 2000 });
    expect(Date.now() - back).toBeLessThan(2000);

    // Undo on one tablet takes the check-in back on both, and on the server.
    const slip = scenario.people[0]!;
    const slipOn = (page: typeof first.page) =>
      page.getByRole('listitem', { name: new RegExp(slip.givenName) });
    await slipOn(first.page).getByRole('button', { name: 'Check in' }).click();
    await slipOn(second.page).getByText('Arrived', { exact: true }).waitFor({ timeout: 2000 });
    await first.page.getByRole('button', { name: 'Undo' }).click();
    await slipOn(second.page).getByText('Booked', { exact: true }).waitFor({ timeout: 2000 });
    await slipOn(first.page).getByText('Booked', { exact: true }).waitFor();
    const slipCheckIns = await env.testApp.db
      .selectFrom('checkIns')
      .select(['undoneAt'])
      .where('personId', '=', slip.id)
      .execute();
    expect(slipCheckIns).toHaveLength(1);
    expect(slipCheckIns[0]!.undoneAt).not.toBeNull();

    await first.context.close();
    await second.context.close();
  });
});
