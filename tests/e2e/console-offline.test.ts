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

describe('station console: offline', () => {
  it('records five check-ins and two sittings offline and sends exactly those when back', async () => {
    const { day, people } = scenario;
    const context = await env.newContext({
      viewport: { width: 1024, height: 768 },
      hasTouch: true,
    });
    const page = await context.newPage();
    await signInWithPassword(page, scenario.photographer.email, TEST_PASSWORD);
    await page.getByRole('heading', { level: 1, name: /Hello,/ }).waitFor();
    await page.goto(`/console/${day.id}/${day.stations[0]!.id}`);
    await page.getByRole('heading', { level: 1, name: 'Station A' }).waitFor();
    const sync = page.getByRole('status', { name: 'Sync' });
    await sync.getByText('All changes saved').waitFor();

    await context.setOffline(true);
    await sync.getByText('Offline — nothing waiting').waitFor();
    const row = (index: number) =>
      page.getByRole('listitem', { name: new RegExp(people[index]!.givenName) });
    for (let index = 0; index < 5; index += 1) {
      await row(index).getByRole('button', { name: 'Check in' }).click();
      await row(index).getByText('Arrived', { exact: true }).waitFor();
      await row(index).getByText('Not yet saved').waitFor();
    }
    await sync.getByText('Offline — 5 changes waiting').waitFor();

    const keypad = page.getByRole('group', { name: 'Frame number of the slate photo' });
    const type = async (group: typeof keypad, digits: string) => {
      await group.getByRole('button', { name: 'Clear' }).click();
      for (const digit of digits)
        await group.getByRole('button', { name: digit, exact: true }).click();
    };
    // First sitting: slate at frame 0101, last frame 0120.
    await row(0).getByRole('button', { name: 'Start sitting' }).click();
    await page.getByRole('dialog', { name: people[0]!.givenName, exact: false }).waitFor();
    await type(keypad, '101');
    await page.getByRole('dialog').getByRole('button', { name: 'Start sitting' }).click();
    await row(0).getByText('In the chair', { exact: true }).waitFor();
    await row(0).getByRole('button', { name: 'Finish sitting' }).click();
    await type(page.getByRole('group', { name: 'Last frame number' }), '120');
    await page.getByRole('dialog').getByRole('button', { name: 'Finish with last frame' }).click();
    await row(0).getByText('Done', { exact: true }).waitFor();

    // Second sitting: the keypad already expects 0121, one after the last frame.
    await row(1).getByRole('button', { name: 'Start sitting' }).click();
    await expect(keypad.locator('output').textContent()).resolves.toBe('0121');
    await page.getByRole('dialog').getByRole('button', { name: 'Start sitting' }).click();
    await row(1).getByRole('button', { name: 'Finish sitting' }).click();
    await page.getByRole('dialog').getByRole('button', { name: 'Finish without' }).click();
    await row(1).getByText('Done', { exact: true }).waitFor();
    await sync.getByText('Offline — 9 changes waiting').waitFor();

    // Nothing has reached the server yet.
    const db = env.testApp.db;
    expect(await db.selectFrom('checkIns').select('id').execute()).toHaveLength(0);

    await context.setOffline(false);
    await sync.getByText('All changes saved').waitFor({ timeout: 20_000 });
    const checkIns = await db.selectFrom('checkIns').select(['personId', 'undoneAt']).execute();
    expect(checkIns.map((item) => item.personId).sort()).toEqual(
      people
        .slice(0, 5)
        .map((person) => person.id)
        .sort(),
    );
    const sittings = await db
      .selectFrom('sittings')
      .select(['personId', 'firstFrame', 'lastFrame', 'finishedAt'])
      .orderBy('startedAt')
      .execute();
    expect(
      sittings.map(({ personId, firstFrame, lastFrame }) => ({ personId, firstFrame, lastFrame })),
    ).toEqual([
      { personId: people[0]!.id, firstFrame: 101, lastFrame: 120 },
      { personId: people[1]!.id, firstFrame: 121, lastFrame: null },
    ]);
    expect(sittings.every((sitting) => sitting.finishedAt !== null)).toBe(true);
    expect(await db.selectFrom('stationActions').select('id').execute()).toHaveLength(9);
    await row(5).getByText('Booked', { exact: true }).waitFor();
    await context.close();
  });
});
