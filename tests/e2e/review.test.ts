import { mkdirSync, mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import {
  insertClient,
  insertOffice,
  insertPerson,
  insertStaff,
  TEST_PASSWORD,
} from '../factories/accounts';
import { insertDayWithStations } from '../factories/shoot-days';
import { insertSitting } from '../factories/sittings';
import { runQueuedJobs } from '../server/booking-jobs';
import { cardFileBytes, planCard, type CardPlan } from '../support/shoot-day-card';
import {
  seriousAxeViolations,
  signInWithPassword,
  startE2e,
  type E2eEnvironment,
} from './support/browser';

// A generated card: a camera clock an hour and two minutes fast, numbers rolling over 9999 →
// 0001, the last sitting without a slate, and one frame shot after its sitting was finished,
// which the next sitting's window could also own (a conflict).
let env: E2eEnvironment;
let dayId: string;
let photographerEmail: string;
let plan: CardPlan;
let card: string;
const names = ['Oriel Thackeray', 'Bartholomew Quint', 'Sunniva Lathe'];

beforeAll(async () => {
  env = await startE2e();
  const db = env.testApp.db;
  const client = await insertClient(db, { name: 'Marrowgate Surveying' });
  const office = await insertOffice(db, client.id, 'Leeds', 'Europe/London');
  const photographer = await insertStaff(db, { role: 'photographer' });
  photographerEmail = photographer.email;
  const day = await insertDayWithStations(db, {
    clientId: client.id,
    officeId: office.id,
    photographerIds: [photographer.id],
  });
  dayId = day.dayId;
  plan = planCard({
    firstSittingAt: new Date('2027-03-04T09:00:00Z'),
    sittings: 3,
    framesPerSitting: 3,
    clockOffsetMs: 3_600_000 + 120_000,
    firstNumber: 9997,
    withoutSlate: [2],
    lateFrameIn: 1,
  });
  for (const sitting of plan.sittings) {
    const [givenName, familyName] = names[sitting.index]!.split(' ');
    const person = await insertPerson(db, client.id, { givenName });
    await db.updateTable('people').set({ familyName }).where('id', '=', person.id).execute();
    await insertSitting(db, {
      dayId,
      stationId: day.stations[0]!.id,
      personId: person.id,
      ...sitting,
    });
  }
  card = mkdtempSync(path.join(os.tmpdir(), 'likeness-card-'));
  for (const file of plan.files) {
    const target = path.join(card, file.cardPath);
    mkdirSync(path.dirname(target), { recursive: true });
    writeFileSync(target, await cardFileBytes(file));
  }
}, 60_000);
afterAll(async () => {
  await env?.close();
  if (card) rmSync(card, { recursive: true, force: true });
});

describe('review of the matching', () => {
  it('matches an uploaded card, and a conflict fixed by dragging stays fixed after a re-run', async () => {
    // Tall enough that source and target are both on screen: a drag that has to scroll
    // the page midway loses its drop in headless Chromium.
    const context = await env.newContext({ viewport: { width: 1280, height: 1500 } });
    const page = await context.newPage();
    await signInWithPassword(page, photographerEmail, TEST_PASSWORD);
    await page.getByRole('heading', { level: 1, name: /Hello,/ }).waitFor();
    await page.goto(`/days/${dayId}/frames`);
    await page.getByLabel('Choose a folder').setInputFiles(path.join(card, 'DCIM'));
    await page
      .getByText(`${plan.files.length} of ${plan.files.length} files done`)
      .waitFor({ timeout: 60_000 });
    await runQueuedJobs(env.testApp);

    await page.getByRole('link', { name: 'frames by sitter' }).click();
    await page.getByRole('heading', { level: 1, name: 'Frames by sitter' }).waitFor();
    const counts = page.getByLabel('Counts');
    const count = async (label: string) =>
      Number(
        (
          await counts
            .locator('div', { has: page.getByText(label, { exact: true }) })
            .locator('dd')
            .textContent()
        )?.replace(/\D/g, ''),
      );
    expect(await count('Frames')).toBe(plan.files.length);
    expect(await count('Conflicts')).toBe(1);
    expect(await count('Left over')).toBe(2);
    // The camera's clock was found from its slates: an hour and two minutes fast.
    await page.getByText(/CV-40117 \+62 min/).waitFor();
    expect(await seriousAxeViolations(page)).toEqual([]);

    // The conflict names both sitters; drag it onto the one it belongs to.
    const conflict = page.getByRole('button', { name: /Two sittings could own this frame/ });
    await expect.poll(() => conflict.count()).toBe(1);
    expect(await conflict.getAttribute('aria-label')).toMatch(
      new RegExp(`${names[1]} or ${names[2]}`),
    );
    const frameId = await conflict.getAttribute('data-frame-id');
    const sitter = page
      .getByRole('region', { name: names[1] })
      .or(page.locator(`section[aria-label="${names[1]}"]`));
    await conflict.dragTo(sitter.first());
    await page.getByText(`1 frame given to ${names[1]}.`).waitFor();
    expect(await count('Conflicts')).toBe(0);
    const moved = page.locator(`section[aria-label="${names[1]}"] [data-frame-id="${frameId}"]`);
    await expect.poll(() => moved.textContent()).toMatch(/by hand/);

    // Match again: the run does not undo a person's decision.
    // The job is queued by the request: wait for its answer before running the queue.
    await Promise.all([
      page.waitForResponse(
        (response) => response.url().endsWith('/review/run') && response.status() === 202,
      ),
      page.getByRole('button', { name: 'Match again' }).click(),
    ]);
    await runQueuedJobs(env.testApp);
    await page.getByText(/Last matched .* when asked/).waitFor({ timeout: 15_000 });
    expect(await moved.count()).toBe(1);
    expect(await count('Conflicts')).toBe(0);

    // The menu way, for keyboard and touch: choose the test frame, mark it, then undo.
    const leftovers = page.getByRole('button', { name: /Nothing ties this frame to a sitter/ });
    await leftovers.first().focus();
    await page.keyboard.press('Space');
    await page.getByRole('button', { name: 'Mark as test frames' }).click();
    await page.getByText('1 frame marked as test frames.').waitFor();
    expect(await count('Test frames')).toBe(1);
    await page.getByRole('button', { name: /Undo: 1 frame marked as test frames/ }).click();
    await page.getByText('Last change undone.').waitFor();
    await expect.poll(() => count('Test frames')).toBe(0);
    expect(await count('Left over')).toBe(2);
    await context.close();
  });
});
