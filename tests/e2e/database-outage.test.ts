import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { insertStaff, TEST_PASSWORD } from '../factories/accounts';
import { createStoppableDatabase, type StoppableDatabase } from '../setup/stoppable-database';
import { signInWithPassword, startE2e, type E2eEnvironment } from './support/browser';

// PostgreSQL of its own, stopped and started again under the open app: the user is told the
// server cannot reach its database and sees the page come back without doing anything.

let database: StoppableDatabase;
let env: E2eEnvironment;

beforeAll(async () => {
  database = await createStoppableDatabase();
  env = await startE2e({ database, reconnect: { firstDelayMs: 50, maxDelayMs: 250 } });
});
afterAll(() => env?.close());

const outageText = /The server cannot reach its database, retrying/;

describe('while the database is down', () => {
  it('says so on the page and on a failed save, and recovers by itself', async () => {
    const admin = await insertStaff(env.testApp.db, { role: 'studio_admin' });
    const context = await env.newContext();
    const page = await context.newPage();
    await signInWithPassword(page, admin.email, TEST_PASSWORD);
    await page.getByRole('heading', { name: /Good to see you/ }).waitFor();
    await page.goto('/studio/clients');
    await page.getByRole('heading', { name: 'Clients' }).waitFor();

    database.stopServer();
    // A save while it is down: the notice over the page says what is wrong.
    const form = page.getByRole('form', { name: 'Add a client' });
    await form.getByLabel('Company name').fill('Brackenridge Tiles');
    await form.getByRole('button', { name: /Add/ }).click();
    await page.getByRole('status').filter({ hasText: outageText }).waitFor();

    // Opening a page while it is down: the page says it is waiting for the database.
    await page.reload();
    await page.getByRole('heading', { name: 'Waiting for the database' }).waitFor();
    expect(await page.getByText(outageText).count()).toBeGreaterThan(0);

    await database.startServer();
    await page.getByRole('heading', { name: 'Clients' }).waitFor({ timeout: 20_000 });
    expect(await page.getByText(outageText).count()).toBe(0);
    await context.close();
  });
});
