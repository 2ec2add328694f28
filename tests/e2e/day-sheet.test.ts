import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { TEST_PASSWORD } from '../factories/accounts';
import { recordedDayScenario } from '../support/recorded-day';
import {
  seriousAxeViolations,
  signInWithPassword,
  startE2e,
  type E2eEnvironment,
} from './support/browser';

let env: E2eEnvironment;
let scenario: Awaited<ReturnType<typeof recordedDayScenario>>;
beforeAll(async () => {
  env = await startE2e();
  scenario = await recordedDayScenario(env.testApp);
});
afterAll(() => env?.close());

describe('the day sheet', () => {
  it('has a frames column and blank rows for walk-ins, and an after-the-day version of what was recorded', async () => {
    const context = await env.newContext();
    const page = await context.newPage();
    await signInWithPassword(page, scenario.photographer.email, TEST_PASSWORD);
    await page.getByRole('heading', { level: 1, name: /Hello,/ }).waitFor();
    await page.goto(`/days/${scenario.day.id}/sheet`);

    const sheetA = page.getByRole('table', { name: 'Station A day sheet' });
    await sheetA.getByRole('columnheader', { name: 'Frames (first – last)' }).waitFor();
    // Four bookings, then eight rows to write walk-ins in by hand.
    await expect(sheetA.getByRole('row').count()).resolves.toBe(1 + 4 + 8);
    await expect(sheetA.getByRole('cell', { name: 'Walk-in:' }).count()).resolves.toBe(8);
    const stationB = page.getByRole('table', { name: 'Station B day sheet' });
    await expect(stationB.getByRole('cell', { name: 'Walk-in:' }).count()).resolves.toBe(8);
    expect(await seriousAxeViolations(page)).toEqual([]);

    await page.getByRole('button', { name: 'After the day (as recorded)' }).click();
    const recordedA = page.getByRole('region', { name: 'Station A, as recorded' });
    const rowOf = (name: string) => recordedA.getByRole('row').filter({ hasText: name });
    await rowOf('Aino').getByText('0101 – 0120').waitFor();
    await rowOf('Aino').getByText('Photographed').waitFor();
    await rowOf('Bram').getByText('No-show').waitFor();
    await rowOf('Carla').getByText('(Walk-in)').waitFor();
    await rowOf('Carla').getByText('0121 – 0130').waitFor();
    await rowOf('Dries').getByText('Photographed at Station B').waitFor();
    await rowOf('Edda').getByText('Nothing recorded').waitFor();
    const recordedB = page.getByRole('region', { name: 'Station B, as recorded' });
    await recordedB
      .getByRole('row')
      .filter({ hasText: 'Dries' })
      .getByText('0005 – 0009')
      .waitFor();
    expect(await seriousAxeViolations(page)).toEqual([]);
    // The version is part of the address, so it prints and reloads as chosen.
    expect(new URL(page.url()).searchParams.get('version')).toBe('recorded');
    await context.close();
  });
});
