import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { TEST_PASSWORD } from '../factories/accounts';
import { insertSitting } from '../factories/sittings';
import { consoleScenario } from './console-support';
import {
  seriousAxeViolations,
  signInWithPassword,
  startE2e,
  type E2eEnvironment,
} from './support/browser';

let env: E2eEnvironment;
let scenario: Awaited<ReturnType<typeof consoleScenario>>;
beforeAll(async () => {
  env = await startE2e();
  // One booking: a flash-sensitive sitter at Station A, now in the chair there.
  scenario = await consoleScenario(env.testApp, 1);
  await insertSitting(env.testApp.db, {
    dayId: scenario.day.id,
    stationId: scenario.day.stations[0]!.id,
    personId: scenario.people[0]!.id,
    startedAt: new Date(),
    firstFrame: 1,
  });
});
afterAll(() => env?.close());

// Caution (common practice): a flash-sensitive sitter must not see a neighbour's flash either.
describe('station console: neighbouring stations hold their flashes', () => {
  it("tells Station B to hold its flashes while Station A's flash-sensitive sitter is in the chair", async () => {
    const context = await env.newContext({
      viewport: { width: 1024, height: 768 },
      hasTouch: true,
    });
    const page = await context.newPage();
    await signInWithPassword(page, scenario.photographer.email, TEST_PASSWORD);
    await page.getByRole('heading', { level: 1, name: /Hello,/ }).waitFor();
    await page.goto(`/console/${scenario.day.id}/${scenario.day.stations[1]!.id}`);
    await page.getByRole('heading', { level: 1, name: 'Station B' }).waitFor();
    await page.getByText(/Hold your flashes: Station A has a sitter in the chair/).waitFor();
    expect(await seriousAxeViolations(page)).toEqual([]);
    await context.close();
  });
});
