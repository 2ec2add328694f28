import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { insertPerson, TEST_PASSWORD } from '../factories/accounts';
import { insertBooking } from '../server/console-support';
import { consoleScenario, smallTouchTargets } from './console-support';
import {
  seriousAxeViolations,
  signInWithPassword,
  startE2e,
  type E2eEnvironment,
} from './support/browser';
import type { Locator, Page } from 'playwright-core';

// The keypad and correction rules are the product's own (issue: a mistyped first frame must
// not block the station).

let env: E2eEnvironment;
let scenario: Awaited<ReturnType<typeof consoleScenario>>;
beforeAll(async () => {
  env = await startE2e();
  scenario = await consoleScenario(env.testApp, 2);
});
afterAll(() => env?.close());

async function openStation(stationIndex: number) {
  const context = await env.newContext({ viewport: { width: 1024, height: 768 }, hasTouch: true });
  const page = await context.newPage();
  await signInWithPassword(page, scenario.photographer.email, TEST_PASSWORD);
  await page.getByRole('heading', { level: 1, name: /Hello,/ }).waitFor();
  const station = scenario.day.stations[stationIndex]!;
  await page.goto(`/console/${scenario.day.id}/${station.id}`);
  await page.getByRole('heading', { level: 1, name: station.name }).waitFor();
  return { context, page };
}

/** Presses the keypad's digit keys, without clearing first. */
async function press(keypad: Locator, digits: string) {
  for (const digit of digits)
    await keypad.getByRole('button', { name: digit, exact: true }).click();
}

const sittingOf = (personId: string) =>
  env.testApp.db
    .selectFrom('sittings')
    .select(['firstFrame', 'lastFrame', 'typedFirstFrame', 'typedLastFrame', 'framesCorrectedAt'])
    .where('personId', '=', personId)
    .where('undoneAt', 'is', null)
    .executeTakeFirst();

const saved = (page: Page) =>
  page.getByRole('status', { name: 'Sync' }).getByText('All changes saved').waitFor();

describe('station console: frame numbers', () => {
  it('replaces the pre-filled slate number with the digits typed', async () => {
    const { context, page } = await openStation(0);
    const [first, second] = scenario.people;
    const row = (person: typeof first) =>
      page.getByRole('listitem', { name: new RegExp(person!.givenName) });
    const keypad = page.getByRole('group', { name: 'Frame number of the slate photo' });

    await row(first).getByRole('button', { name: 'Check in' }).click();
    await row(first).getByRole('button', { name: 'Start sitting' }).click();
    await press(keypad, '440');
    await page.getByRole('dialog').getByRole('button', { name: 'Start sitting' }).click();
    await row(first).getByRole('button', { name: 'Finish sitting' }).click();
    await press(page.getByRole('group', { name: 'Last frame number' }), '450');
    await page.getByRole('dialog').getByRole('button', { name: 'Finish with last frame' }).click();
    await row(first).getByText('Done', { exact: true }).waitFor();

    await row(second).getByRole('button', { name: 'Check in' }).click();
    await row(second).getByRole('button', { name: 'Start sitting' }).click();
    // One after the last frame, pre-filled; typing a full number replaces it.
    await expect(keypad.locator('output').textContent()).resolves.toBe('0451');
    await press(keypad, '0452');
    await expect(keypad.locator('output').textContent()).resolves.toBe('0452');
    await page.getByRole('dialog').getByRole('button', { name: 'Start sitting' }).click();
    await row(second).getByText('In the chair', { exact: true }).waitFor();
    await saved(page);
    expect(await sittingOf(second!.id)).toMatchObject({ firstFrame: 452, typedFirstFrame: 452 });
    await context.close();
  });

  it('corrects a mistyped first frame offered when the last frame is refused, then finishes', async () => {
    const db = env.testApp.db;
    const stationB = scenario.day.stations[1]!;
    const person = await insertPerson(db, scenario.client.id, {
      officeId: scenario.office.id,
      givenName: 'Ilse',
    });
    await insertBooking(db, {
      dayId: scenario.day.id,
      stationId: stationB.id,
      personId: person.id,
      startsAt: new Date(Date.now() + 30 * 60_000),
    });
    const { context, page } = await openStation(1);
    const row = page.getByRole('listitem', { name: /Ilse/ });
    await row.getByRole('button', { name: 'Check in' }).click();
    await row.getByRole('button', { name: 'Start sitting' }).click();
    // An extra digit on the slate keypad: 4510 for 0451.
    await press(page.getByRole('group', { name: 'Frame number of the slate photo' }), '4510');
    await page.getByRole('dialog').getByRole('button', { name: 'Start sitting' }).click();
    await row.getByText('In the chair', { exact: true }).waitFor();

    await row.getByRole('button', { name: 'Finish sitting' }).click();
    const dialog = page.getByRole('dialog', { name: /Finish Ilse/ });
    await press(dialog.getByRole('group', { name: 'Last frame number' }), '466');
    await dialog.getByRole('button', { name: 'Finish with last frame' }).click();
    await dialog
      .getByRole('alert')
      .getByText(/The last frame 0466 does not follow the first, 4510/)
      .waitFor();
    // Refused: the sitting is still in the chair, and nothing was sent.
    await row.getByText('In the chair', { exact: true }).waitFor();
    expect(await seriousAxeViolations(page)).toEqual([]);
    expect(await smallTouchTargets(page)).toEqual([]);

    await dialog
      .getByRole('button', { name: 'First frame was typed as 4510 — correct it' })
      .click();
    const firstKeypad = dialog.getByRole('group', { name: 'Corrected first frame' });
    await expect(firstKeypad.locator('output').textContent()).resolves.toBe('4510');
    await press(firstKeypad, '0451');
    await expect(firstKeypad.locator('output').textContent()).resolves.toBe('0451');
    expect(await smallTouchTargets(page)).toEqual([]);
    await dialog.getByRole('button', { name: 'Correct and finish' }).click();
    await row.getByText('Done', { exact: true }).waitFor();
    await saved(page);

    expect(await sittingOf(person.id)).toMatchObject({
      firstFrame: 451,
      lastFrame: 466,
      typedFirstFrame: 4510,
      typedLastFrame: 466,
      framesCorrectedAt: expect.any(Date),
    });
    const kinds = await db
      .selectFrom('stationActions')
      .select('kind')
      .where('stationId', '=', stationB.id)
      .orderBy('id')
      .execute();
    expect(kinds.map((item) => item.kind)).toEqual([
      'check_in_person',
      'start_sitting',
      'correct_frames',
      'finish_sitting',
    ]);
    // The station shows the corrected numbers, and that they were corrected.
    const lastFinished = page.getByRole('group', { name: /Last finished: Ilse/ });
    await lastFinished.getByText('0451–0466').waitFor();
    await lastFinished.getByText('Corrected: first typed as 4510').waitFor();
    await context.close();
  });
});
