import type { Server } from 'node:http';
import path from 'node:path';
import AxeBuilder from '@axe-core/playwright';
import { chromium, type Browser, type BrowserContext, type Page } from 'playwright-core';
import { startTestApp, type TestApp } from '../../setup/test-app';

const root = path.resolve(import.meta.dirname, '../../..');

export interface E2eEnvironment {
  testApp: TestApp;
  baseUrl: string;
  browser: Browser;
  newContext(options?: Parameters<Browser['newContext']>[0]): Promise<BrowserContext>;
  close(): Promise<void>;
}

/** Launch flags that work on these machines (closed network, root, no GPU). */
export const chromiumArgs = [
  '--headless',
  '--no-sandbox',
  '--disable-gpu',
  '--disable-quic',
  '--no-first-run',
  '--disable-background-networking',
  '--disable-component-update',
  '--disable-sync',
];

/** The built app on a real HTTP port, a database of its own, and Debian's Chromium. */
export async function startE2e(
  options: { chromiumArgs?: string[] } & Pick<
    NonNullable<Parameters<typeof startTestApp>[0]>,
    'database' | 'reconnect'
  > = {},
): Promise<E2eEnvironment> {
  const testApp = await startTestApp({
    frontend: { kind: 'static', folder: path.join(root, 'dist') },
    database: options.database,
    reconnect: options.reconnect,
  });
  const server: Server = await new Promise((resolve) => {
    const listening = testApp.app.listen(0, '127.0.0.1', () => resolve(listening));
  });
  const address = server.address();
  const port = typeof address === 'object' && address ? address.port : 0;
  const baseUrl = `http://127.0.0.1:${port}`;
  // Links in e-mails must point at this server.
  testApp.config.publicUrl = baseUrl;

  // Playwright gives every launch a fresh, empty profile of its own.
  const browser = await chromium.launch({
    executablePath: '/usr/bin/chromium',
    args: [...chromiumArgs, ...(options.chromiumArgs ?? [])],
  });
  return {
    testApp,
    baseUrl,
    browser,
    newContext: (contextOptions) => browser.newContext({ baseURL: baseUrl, ...contextOptions }),
    async close() {
      await browser.close();
      await new Promise<void>((resolve) => {
        server.close(() => resolve());
        server.closeAllConnections();
      });
      await testApp.close();
    },
  };
}

/** Serious and critical accessibility violations on the current page (axe-core). */
export async function seriousAxeViolations(page: Page) {
  const results = await new AxeBuilder({ page }).analyze();
  return results.violations
    .filter((violation) => violation.impact === 'serious' || violation.impact === 'critical')
    .map((violation) => ({
      id: violation.id,
      impact: violation.impact,
      help: violation.help,
      targets: violation.nodes.map((node) => node.target.join(' ')),
    }));
}

export async function signInWithPassword(page: Page, email: string, password: string) {
  await page.goto('/sign-in');
  const form = page.getByRole('form', { name: 'Sign in with a password' });
  await form.getByLabel('E-mail').fill(email);
  await form.getByLabel('Password').fill(password);
  await form.getByRole('button', { name: 'Sign in' }).click();
}
