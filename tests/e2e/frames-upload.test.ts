import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { insertClient, insertOffice, insertStaff, TEST_PASSWORD } from '../factories/accounts';
import { insertDayWithStations } from '../factories/shoot-days';
import { runQueuedJobs } from '../server/booking-jobs';
import { cameraJpeg, pngImage } from '../support/camera-cards';
import {
  seriousAxeViolations,
  signInWithPassword,
  startE2e,
  type E2eEnvironment,
} from './support/browser';

let env: E2eEnvironment;
let dayId: string;
let photographerEmail: string;
beforeAll(async () => {
  env = await startE2e();
  const db = env.testApp.db;
  const client = await insertClient(db, { name: 'Halvorsen & Pike Engineering' });
  const office = await insertOffice(db, client.id, 'Leeds', 'Europe/London');
  const photographer = await insertStaff(db, { role: 'photographer' });
  photographerEmail = photographer.email;
  const day = await insertDayWithStations(db, {
    clientId: client.id,
    officeId: office.id,
    photographerIds: [photographer.id, photographer.id],
  });
  dayId = day.dayId;
});
afterAll(() => env?.close());

describe('frames page', () => {
  it('uploads frames through a dropped connection, refuses a PNG, and shows them read', async () => {
    const context = await env.newContext({ viewport: { width: 1280, height: 1000 } });
    const page = await context.newPage();
    await signInWithPassword(page, photographerEmail, TEST_PASSWORD);
    await page.getByRole('heading', { level: 1, name: /Hello,/ }).waitFor();
    await page.goto(`/days/${dayId}`);
    await page.getByRole('link', { name: 'Frames (upload the cards)' }).click();
    await page.getByRole('heading', { level: 1, name: 'Frames' }).waitFor();
    await page.getByText('No frames yet').waitFor();
    expect(await seriousAxeViolations(page)).toEqual([]);

    // The venue network drops as the first bytes go out: the page waits, then resumes.
    let dropped = false;
    await page.route('**/api/uploads/*', async (route) => {
      if (!dropped && route.request().method() === 'PATCH') {
        dropped = true;
        await context.setOffline(true);
        await route.abort('internetdisconnected');
        setTimeout(() => void context.setOffline(false), 1500);
        return;
      }
      await route.continue();
    });

    const frames = await Promise.all(
      [1, 2, 3].map((number) =>
        cameraJpeg({
          width: 1600,
          height: 1067,
          shade: 80 + number * 20,
          dateTimeOriginal: `2027:03:04 09:1${number}:00`,
          serial: 'CV-000123',
        }),
      ),
    );
    await page.getByTestId('frame-files').setInputFiles([
      ...frames.map((buffer, index) => ({
        name: `HPE_000${index + 1}.JPG`,
        mimeType: 'image/jpeg',
        buffer,
      })),
      { name: 'HPE_0099.JPG', mimeType: 'image/jpeg', buffer: await pngImage() },
    ]);
    const files = page.getByRole('list', { name: 'Files' });
    await files.getByText(/is not a camera frame/).waitFor();
    await page.getByText('3 of 4 files done').waitFor({ timeout: 30_000 });
    expect(dropped).toBe(true);

    await runQueuedJobs(env.testApp);
    const grid = page.getByRole('list', { name: 'Frames' });
    await grid.getByRole('img', { name: 'Frame HPE_0001.JPG' }).waitFor({ timeout: 15_000 });
    expect(await grid.getByRole('img').count()).toBe(3);
    await page.getByRole('cell', { name: 'CV-000123' }).waitFor();
    expect(await seriousAxeViolations(page)).toEqual([]);
    await context.close();
  });
});
