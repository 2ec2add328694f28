import { execFileSync } from 'node:child_process';
import { mkdtempSync, rmSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { insertStaff, TEST_PASSWORD } from '../factories/accounts';
import { runQueuedJobs } from '../server/booking-jobs';
import { setUpProofsDay } from '../server/proofs-day';
import { createUpload, patchUpload } from '../server/tus-client';
import { cameraJpeg } from '../support/camera-cards';
import { debianPortrait, placePortrait } from '../support/debian-portrait';
import {
  seriousAxeViolations,
  signInWithPassword,
  startE2e,
  type E2eEnvironment,
} from './support/browser';

// Two sitters' finals: one holds a real face (the Debian archive's public-domain portrait),
// one a plain frame where no face can be found, so it needs a hand.
let env: E2eEnvironment;
let ready: Awaited<ReturnType<typeof setUpProofsDay>>;
let adminEmail: string;
let coordinatorEmail: string;
let folder: string;

beforeAll(async () => {
  env = await startE2e();
  const t = env.testApp;
  ready = await setUpProofsDay(t, 2);
  adminEmail = (await insertStaff(t.db, { role: 'studio_admin' })).email;
  coordinatorEmail = (await insertStaff(t.db, { role: 'coordinator', clientId: ready.client.id }))
    .email;
  for (const sitter of ready.sitters) {
    const proofs = (await sitter.agent.get(`/api/proofs/${ready.day.dayId}`).expect(200)).body;
    await sitter.agent
      .put(`/api/proofs/${ready.day.dayId}/picks`)
      .send({ picks: [{ frameId: proofs.frames[0].id }] })
      .expect(200);
  }
  const picks = await t.db.selectFrom('picks').select(['id', 'personId']).execute();
  const placed = await placePortrait(await debianPortrait(), {
    frameWidth: 4000,
    frameHeight: 5000,
    left: 700,
    top: 1200,
    scale: 5,
    rollDeg: 0.5,
  });
  const finals = [placed.frame, await cameraJpeg({ width: 3000, height: 3750, shade: 150 })];
  for (const [index, sitter] of ready.sitters.entries()) {
    const pickId = picks.find((pick) => pick.personId === sitter.id)!.id;
    const created = await createUpload(
      ready.session,
      { purpose: 'final', dayId: ready.day.dayId, pickId, cardPath: `HPE_01${index}.jpg` },
      finals[index]!.length,
    );
    expect((await patchUpload(ready.session, created.url!, 0, finals[index]!)).status).toBe(204);
  }
  folder = mkdtempSync(path.join(os.tmpdir(), 'likeness-download-'));
}, 240_000);
afterAll(async () => {
  await ready?.session.close();
  await env?.close();
  if (folder) rmSync(folder, { recursive: true, force: true });
});

describe('looks and delivery', () => {
  it('the studio admin sets up the look from presets and sees file names for real people', async () => {
    const context = await env.newContext({ viewport: { width: 1280, height: 1000 } });
    const page = await context.newPage();
    await signInWithPassword(page, adminEmail, TEST_PASSWORD);
    await page.getByRole('button', { name: 'Sign out' }).waitFor();
    await page.goto('/studio/clients');
    await page.locator(`a[href="/clients/${ready.client.id}/look"]`).click();
    await page.getByRole('heading', { level: 1, name: 'Look' }).waitFor();
    for (const name of ['Portrait 4:5', 'Square profile', 'ID badge']) {
      await page.getByRole('button', { name: `Add ${name}` }).click();
    }
    await expect.poll(() => page.getByRole('group', { name: /^Rendition / }).count()).toBe(3);
    // The ID badge's eye line carries its source beside it.
    await page
      .getByText(/19794-5/)
      .first()
      .waitFor();
    const template = page.getByLabel('File-name template');
    await template.fill('{employee_id}_{family}_{surname}');
    await page.getByText('Unknown parts: {surname}').waitFor();
    await template.fill('{family}_{given}_{rendition}');
    await page
      .getByRole('list', { name: 'File names for real people' })
      .getByText(/_Robin_portrait\.jpg$/)
      .first()
      .waitFor();
    expect(await seriousAxeViolations(page)).toEqual([]);
    await page.getByRole('button', { name: 'Save the look' }).click();
    await page.getByText('Look saved (version 1).').waitFor();
    await context.close();
  });

  it('the photographer renders the set, marks the eyes the detection missed, and releases it', async () => {
    const context = await env.newContext({ viewport: { width: 1280, height: 1200 } });
    const page = await context.newPage();
    await signInWithPassword(page, ready.photographer.email, TEST_PASSWORD);
    await page.getByRole('button', { name: 'Sign out' }).waitFor();
    await page.goto(`/days/${ready.day.dayId}`);
    await page.getByRole('link', { name: 'The set (renditions and delivery)' }).click();
    await page.getByRole('heading', { level: 1, name: 'The set' }).waitFor();
    // Nothing rendered yet: the release is not offered, and the page says why.
    const releaseButton = page.getByRole('button', {
      name: 'Release the set to HR and the sitters',
    });
    await page.getByText(/^Not every portrait is rendered in the current look/).waitFor();
    expect(await releaseButton.isDisabled()).toBe(true);
    await page.getByRole('button', { name: 'Find eyes and render the set' }).click();
    await page.getByText(/Finding the eyes in 2 portraits/).waitFor();
    await runQueuedJobs(env.testApp);
    const hand = page.getByRole('region', { name: 'Needs a hand' });
    await hand.getByText(/No face was found/).waitFor({ timeout: 15_000 });
    const grid = page.getByRole('table', { name: 'The set, one row per portrait' });
    await expect.poll(() => grid.getByRole('img').count(), { timeout: 15_000 }).toBe(3);
    await hand.getByRole('button', { name: /Mark the eyes of/ }).click();
    // Keyboard: nudge the left mark ten steps to the right, then save.
    const left = hand.getByRole('button', { name: /Left eye mark/ });
    await left.focus();
    for (let step = 0; step < 5; step += 1) await page.keyboard.press('Shift+ArrowRight');
    await hand.getByRole('button', { name: 'Save the eye marks' }).click();
    await page.getByText(/Eye marks saved for/).waitFor();
    await runQueuedJobs(env.testApp);
    await grid.getByText('eyes marked by hand').waitFor({ timeout: 15_000 });
    // A mark put down wrongly can be moved again, starting from where it is.
    const markedRow = grid.getByRole('row').filter({ hasText: 'eyes marked by hand' });
    await markedRow.getByRole('button', { name: /Move the eye marks of/ }).click();
    const again = grid.getByRole('button', { name: /Right eye mark/ });
    await again.focus();
    await page.keyboard.press('Shift+ArrowRight');
    await grid.getByRole('button', { name: 'Save the eye marks' }).click();
    await page.getByText(/Eye marks saved for/).waitFor();
    await runQueuedJobs(env.testApp);
    await markedRow.getByRole('button', { name: /Move the eye marks of/ }).waitFor();
    await page.getByRole('button', { name: 'Release the set to HR and the sitters' }).click();
    // One more step, as a release reaches HR and the sitters at once; "Not yet" leaves it.
    const confirm = page.getByRole('group', { name: 'Confirm the release' });
    await confirm.getByText(/each sitter gets an e-mail with their link/).waitFor();
    await confirm.getByRole('button', { name: 'Not yet' }).click();
    await confirm.waitFor({ state: 'detached' });
    await page.getByText('Nothing released yet.').waitFor();
    await page.getByRole('button', { name: 'Release the set to HR and the sitters' }).click();
    await confirm.getByRole('button', { name: 'Release it now' }).click();
    await page.getByText(/^Release 1: /).waitFor();
    await context.close();
  });

  it('HR downloads the whole set with its manifest', async () => {
    const context = await env.newContext({
      viewport: { width: 1280, height: 1000 },
      acceptDownloads: true,
    });
    const page = await context.newPage();
    await signInWithPassword(page, coordinatorEmail, TEST_PASSWORD);
    await page.getByRole('button', { name: 'Sign out' }).waitFor();
    await page.goto(`/days/${ready.day.dayId}`);
    const downloading = page.waitForEvent('download');
    await page.getByRole('link', { name: 'Download the whole set (ZIP)' }).click();
    const download = await downloading;
    const file = path.join(folder, 'set.zip');
    await download.saveAs(file);
    const names = execFileSync('unzip', ['-Z1', file], { encoding: 'utf8' }).trim().split('\n');
    expect(names.slice(0, 2)).toEqual(['manifest.csv', 'missing.csv']);
    expect(names.length).toBeGreaterThanOrEqual(5);
    for (const name of names.slice(2))
      expect(name).toMatch(/^Sample-[0-9a-f]+_Robin_[A-Za-z0-9-]+\.jpg$/);
    await context.close();
  });
});
