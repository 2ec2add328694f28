import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { TEST_PASSWORD } from '../factories/accounts';
import { setUpMatchedDay, setUpProofsDay } from '../server/proofs-day';
import { cameraJpeg } from '../support/camera-cards';
import {
  seriousAxeViolations,
  signInWithPassword,
  startE2e,
  type E2eEnvironment,
} from './support/browser';

// A matched day whose proofs have gone out: a sitter chooses on a phone, the photographer
// works the retouch queue on a laptop and sends a final back.
let env: E2eEnvironment;
let ready: Awaited<ReturnType<typeof setUpProofsDay>>;

beforeAll(async () => {
  env = await startE2e();
  ready = await setUpProofsDay(env.testApp, 2, { redeemLinks: false });
}, 120_000);
afterAll(async () => {
  await ready?.session.close();
  await env?.close();
});

describe('proofs and the retouch queue', () => {
  it('a sitter chooses on a phone, changes their mind, and leaves a note', async () => {
    const context = await env.newContext({
      viewport: { width: 390, height: 844 },
      isMobile: true,
      hasTouch: true,
    });
    const page = await context.newPage();
    const link = /(http:\/\/\S+\/link\/\S+)/.exec(ready.sitters[0]!.mail.text)![1]!;
    await page.goto(link);
    await page.getByRole('heading', { level: 1, name: 'Choose your portrait' }).waitFor();
    const proofs = page.getByRole('list', { name: 'Your proofs' });
    await expect.poll(() => proofs.getByRole('img').count()).toBe(3);
    // The images load through their signed URLs.
    await expect
      .poll(() =>
        proofs
          .getByRole('img')
          .first()
          .evaluate((img: HTMLImageElement) => img.naturalWidth),
      )
      .toBeGreaterThan(0);
    expect(await seriousAxeViolations(page)).toEqual([]);

    await page.getByRole('button', { name: 'Choose portrait 1' }).tap();
    await page.getByLabel('Note for the retouch (optional)').fill('A stray hair over the ear');
    await page.getByRole('button', { name: /Save my choice \(1 chosen\)/ }).tap();
    await page.getByText('Saved. You can change it until the deadline.').waitFor();

    // One portrait in the package: choosing another takes the place of the first, note and all.
    await page.getByRole('button', { name: 'Choose portrait 2' }).tap();
    await expect
      .poll(() => page.getByRole('button', { name: 'Portrait 1: chosen' }).count())
      .toBe(0);
    await page.getByRole('button', { name: /Save my choice/ }).tap();
    await page.getByText('Saved. You can change it until the deadline.').waitFor();
    const picks = await env.testApp.db
      .selectFrom('picks')
      .where('personId', '=', ready.sitters[0]!.id)
      .select(['frameId', 'note', 'chosenBy'])
      .execute();
    const frames = await env.testApp.db
      .selectFrom('frames')
      .where('dayId', '=', ready.day.dayId)
      .where('slateToken', 'is', null)
      .select(['id', 'cardPath'])
      .orderBy('cardPath')
      .execute();
    expect(picks).toHaveLength(1);
    expect(picks[0]).toMatchObject({ note: 'A stray hair over the ear', chosenBy: 'sitter' });
    expect(frames.map((frame) => frame.id)).toContain(picks[0]!.frameId);
    await context.close();
  });

  it('the photographer takes the pick and sends back a final matched by its name', async () => {
    const context = await env.newContext({ viewport: { width: 1280, height: 1000 } });
    const page = await context.newPage();
    await signInWithPassword(page, ready.photographer.email, TEST_PASSWORD);
    await page.getByRole('heading', { level: 1, name: /Hello,/ }).waitFor();
    await page.goto(`/days/${ready.day.dayId}`);
    await page.getByRole('link', { name: 'Retouch queue' }).click();
    await page.getByRole('heading', { level: 1, name: 'Retouch queue' }).waitFor();
    const table = page.getByRole('table', { name: 'Picks to retouch' });
    await table.getByText('“A stray hair over the ear”').waitFor();
    expect(await seriousAxeViolations(page)).toEqual([]);
    await table.getByRole('button', { name: 'Take it' }).click();
    await table.getByText('with you').waitFor();

    const original = (await table.locator('a[download]').first().textContent())!.trim();
    const edited = original.replace(/\.JPG$/i, '-Edit.jpg');
    await page.getByTestId('final-files').setInputFiles({
      name: edited,
      mimeType: 'image/jpeg',
      buffer: await cameraJpeg({ width: 900, height: 600, shade: 190 }),
    });
    const files = page.getByRole('list', { name: 'Retouched files to send' });
    await files.getByText('matched by name').waitFor();
    await page.getByRole('button', { name: 'Send 1 final' }).click();
    await page.getByText(`${edited}: stored beside the original`).waitFor({ timeout: 30_000 });
    await table.getByText('Done').waitFor();
    await table.getByRole('link', { name: `Final: ${edited}` }).waitFor();

    // The sitter changes the note afterwards: the queue says so and offers the pick again.
    await env.testApp.db
      .updateTable('picks')
      .set({ note: 'And the collar, please' })
      .where('personId', '=', ready.sitters[0]!.id)
      .execute();
    await page.reload();
    await table
      .getByText(
        'The note changed after the final was sent; the final was made for “A stray hair over the ear”.',
      )
      .waitFor();
    await table.getByRole('button', { name: 'Take it again' }).click();
    await table.getByText('with you').waitFor();
    await context.close();
  });
});

describe('sending the proofs', () => {
  it('asks once more, says who is mailed and until when, and "Not yet" sends nothing', async () => {
    const matched = await setUpMatchedDay(env.testApp, 2);
    await matched.session.close();
    const context = await env.newContext({ viewport: { width: 1280, height: 1000 } });
    const page = await context.newPage();
    await signInWithPassword(page, matched.photographer.email, TEST_PASSWORD);
    await page.getByRole('heading', { level: 1, name: /Hello,/ }).waitFor();
    await page.goto(`/days/${matched.day.dayId}/review`);
    await page.getByRole('heading', { level: 1, name: 'Frames by sitter' }).waitFor();
    await page.getByRole('button', { name: 'Send proofs' }).click();
    const confirm = page.getByRole('group', { name: 'Confirm sending the proofs' });
    await confirm.getByText(/Each of the 2 sitters with matched frames gets an e-mail/).waitFor();
    await confirm.getByText(/not called back/).waitFor();
    expect(await seriousAxeViolations(page)).toEqual([]);
    await confirm.getByRole('button', { name: 'Not yet' }).click();
    const mailed = () =>
      env.testApp.db
        .selectFrom('dayMailings')
        .where('dayId', '=', matched.day.dayId)
        .where('kind', '=', 'proofs')
        .select('id')
        .execute();
    expect(await mailed()).toHaveLength(0);

    await page.getByRole('button', { name: 'Send proofs' }).click();
    await confirm.getByRole('button', { name: 'Send them now' }).click();
    await page.getByText('Proofs queued for 2 sitters.').waitFor();
    expect(await mailed()).toHaveLength(2);
    await context.close();
  });
});
