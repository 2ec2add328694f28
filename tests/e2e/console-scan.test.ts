import { mkdtempSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { TEST_PASSWORD } from '../factories/accounts';
import { decodePng } from '../reference/decode-png';
import { signedInAgent } from '../server/helpers';
import { consoleScenario, smallTouchTargets, writeY4m } from './console-support';
import {
  seriousAxeViolations,
  signInWithPassword,
  startE2e,
  type E2eEnvironment,
} from './support/browser';
import { NO_FLASH_WORDING } from '../../server/schemas/sitter-wording';

// Chromium reads its fake camera file at launch, so the file is named before the pass exists
// and written (from the pass the app issues) before the page asks for the camera.
const folder = mkdtempSync(path.join(tmpdir(), 'likeness-camera-'));
const cameraFile = path.join(folder, 'pass.y4m');

let env: E2eEnvironment;
let scenario: Awaited<ReturnType<typeof consoleScenario>>;
beforeAll(async () => {
  env = await startE2e({
    chromiumArgs: [
      '--use-fake-ui-for-media-stream',
      '--use-fake-device-for-media-stream',
      `--use-file-for-fake-video-capture=${cameraFile}`,
    ],
  });
  scenario = await consoleScenario(env.testApp, 2);
  // The pass exactly as the app issues it to the sitter.
  const agent = await signedInAgent(env.testApp, scenario.photographer.email);
  const sitter = scenario.people[1]!;
  const pass = await agent.get(`/api/bookings/${sitter.booking.id}/pass.png`).expect(200);
  writeY4m(cameraFile, pass.body as Buffer);
});
afterAll(() => env?.close());

describe('station console: scanning a pass', () => {
  it('picks a station, shows the queue accessibly, and checks in a pass held to the camera', async () => {
    const context = await env.newContext({
      viewport: { width: 1024, height: 768 },
      hasTouch: true,
    });
    const page = await context.newPage();
    await signInWithPassword(page, scenario.photographer.email, TEST_PASSWORD);
    await page.getByRole('heading', { level: 1, name: /Hello,/ }).waitFor();
    await page.getByRole('link', { name: 'Station console' }).click();
    await page.getByRole('button', { name: /Station A/ }).click();
    await page.getByRole('heading', { level: 1, name: 'Station A' }).waitFor();

    const flashSitter = page.getByRole('listitem', {
      name: new RegExp(scenario.people[0]!.givenName),
    });
    await flashSitter.getByText(NO_FLASH_WORDING).waitFor();
    await page.getByText(/flash-sensitive sitter is still to come/).waitFor();
    expect(await seriousAxeViolations(page)).toEqual([]);
    expect(await smallTouchTargets(page)).toEqual([]);

    // The console address lands on the picker, with this tablet's station one tap away and a
    // way back to the photographer's days.
    await page.goto('/console');
    await page.getByRole('heading', { level: 1, name: 'Station console' }).waitFor();
    await page.getByRole('link', { name: /My days/ }).waitFor();
    await page.getByRole('button', { name: 'Continue at Station A' }).click();
    await page.getByRole('heading', { level: 1, name: 'Station A' }).waitFor();

    await page.getByRole('button', { name: 'Check in', exact: true }).first().click();
    await page.getByRole('tab', { name: 'Scan pass', selected: true }).waitFor();
    const sitter = scenario.people[1]!;
    await page
      .getByText(new RegExp(`${sitter.givenName} .* is checked in`))
      .waitFor({ timeout: 15_000 });
    const row = page.getByRole('listitem', { name: new RegExp(sitter.givenName) });
    await row.getByText('Arrived', { exact: true }).waitFor();
    await page.getByRole('status', { name: 'Sync' }).getByText('All changes saved').waitFor();
    // The pass stays in front of the camera (the fake camera loops it) for longer than the
    // scanner's old pause: it is one scan, so no "already checked in" follows it.
    await page.waitForTimeout(7000);
    expect(await page.getByText(/already checked in/).count()).toBe(0);
    const passScans = await env.testApp.db
      .selectFrom('stationActions')
      .select('id')
      .where('kind', '=', 'check_in_pass')
      .execute();
    expect(passScans).toHaveLength(1);
    expect(await seriousAxeViolations(page)).toEqual([]);
    expect(await smallTouchTargets(page)).toEqual([]);

    // The slate: full screen, its QR code readable by an independent decoder, and nothing on
    // it moving or flashing (WCAG 2.3.1 allows at most three flashes a second; it has none).
    await row.getByRole('button', { name: 'Start sitting' }).click();
    const slate = page.getByRole('dialog', { name: new RegExp(sitter.givenName) });
    await slate.getByRole('img', { name: /Slate code/ }).waitFor();
    const shot = await slate.getByRole('img', { name: /Slate code/ }).screenshot();
    const slateToken = decodePng(shot).code?.data;
    expect(slateToken).toMatch(/^[A-Z2-7]{26}$/);
    expect(await page.evaluate(() => document.getAnimations().length)).toBe(0);
    expect(await seriousAxeViolations(page)).toEqual([]);
    expect(await smallTouchTargets(page)).toEqual([]);
    const keypad = slate.getByRole('group', { name: 'Frame number of the slate photo' });
    for (const digit of '42')
      await keypad.getByRole('button', { name: digit, exact: true }).click();
    await slate.getByRole('button', { name: 'Start sitting' }).click();
    await row.getByText('In the chair', { exact: true }).waitFor();
    await page.getByRole('status', { name: 'Sync' }).getByText('All changes saved').waitFor();
    const sitting = await env.testApp.db
      .selectFrom('sittings')
      .select(['slateToken', 'firstFrame', 'personId'])
      .executeTakeFirstOrThrow();
    expect(sitting).toEqual({ slateToken, firstFrame: 42, personId: sitter.id });

    const checkIns = await env.testApp.db
      .selectFrom('checkIns')
      .select(['personId', 'method', 'stationId'])
      .execute();
    expect(checkIns).toEqual([
      { personId: sitter.id, method: 'pass', stationId: scenario.day.stations[0]!.id },
    ]);
    await context.close();
  });
});
