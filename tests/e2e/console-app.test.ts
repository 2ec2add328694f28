import { PNG } from 'pngjs';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { TEST_PASSWORD } from '../factories/accounts';
import { consoleScenario } from './console-support';
import { signInWithPassword, startE2e, type E2eEnvironment } from './support/browser';

let env: E2eEnvironment;
let scenario: Awaited<ReturnType<typeof consoleScenario>>;
beforeAll(async () => {
  env = await startE2e();
  scenario = await consoleScenario(env.testApp, 2);
});
afterAll(() => env?.close());

describe('station console as an installed app', () => {
  it('declares a manifest with icons of the sizes it claims', async () => {
    const context = await env.newContext();
    const manifest = await (await context.request.get('/manifest.webmanifest')).json();
    expect(manifest).toMatchObject({ start_url: '/console', display: 'standalone' });
    for (const icon of manifest.icons as Array<{ src: string; sizes: string; type: string }>) {
      const response = await context.request.get(icon.src);
      expect(response.status(), icon.src).toBe(200);
      if (icon.type === 'image/png') {
        const image = PNG.sync.read(await response.body());
        expect(`${image.width}x${image.height}`).toBe(icon.sizes);
      }
    }
    await context.close();
  });

  it('opens again without network once loaded, from what the tablet stored', async () => {
    const { day, people } = scenario;
    const context = await env.newContext({ viewport: { width: 1024, height: 768 } });
    const page = await context.newPage();
    await signInWithPassword(page, scenario.photographer.email, TEST_PASSWORD);
    await page.getByRole('heading', { level: 1, name: /Hello,/ }).waitFor();
    await page.goto(`/console/${day.id}/${day.stations[0]!.id}`);
    await page.getByRole('heading', { level: 1, name: 'Station A' }).waitFor();
    await page.evaluate(async () => {
      await navigator.serviceWorker.ready;
    });
    // A second load, now under the worker's control, stores every file the console uses.
    await page.reload();
    await page.getByRole('heading', { level: 1, name: 'Station A' }).waitFor();
    await page.waitForFunction(() => navigator.serviceWorker.controller !== null);

    await context.setOffline(true);
    await page.reload();
    await page.getByRole('heading', { level: 1, name: 'Station A' }).waitFor();
    await page
      .getByRole('listitem', { name: new RegExp(people[1]!.givenName) })
      .getByText('Booked', { exact: true })
      .waitFor();
    await page
      .getByRole('status', { name: 'Sync' })
      .getByText(/^Offline/)
      .waitFor();
    await context.close();
  });
});
