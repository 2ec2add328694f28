import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { sendQueuedLinks } from '../server/helpers';
import {
  insertClient,
  insertOffice,
  insertPerson,
  insertStaff,
  TEST_PASSWORD,
} from '../factories/accounts';
import {
  seriousAxeViolations,
  signInWithPassword,
  startE2e,
  type E2eEnvironment,
} from './support/browser';

let env: E2eEnvironment;
let clientId: string;
beforeAll(async () => {
  env = await startE2e();
  clientId = (await insertClient(env.testApp.db, { name: 'Halvorsen & Pike Engineering' })).id;
});
afterAll(() => env?.close());

const homes = [
  { role: 'studio_admin' as const, heading: /Good to see you/, nav: 'Clients' },
  { role: 'photographer' as const, heading: /Hello,/, nav: 'My days' },
  { role: 'coordinator' as const, heading: /Welcome,/, nav: 'Overview' },
];

describe('signing in', () => {
  it('the sign-in page has no serious accessibility violations', async () => {
    const context = await env.newContext();
    const page = await context.newPage();
    await page.goto('/sign-in');
    await page.getByRole('heading', { name: 'Sign in' }).waitFor();
    expect(await seriousAxeViolations(page)).toEqual([]);
    await context.close();
  });

  for (const { role, heading, nav } of homes) {
    it(`a ${role} signs in and lands on their home page`, async () => {
      const user = await insertStaff(env.testApp.db, {
        role,
        clientId: role === 'coordinator' ? clientId : null,
      });
      const context = await env.newContext();
      const page = await context.newPage();
      await signInWithPassword(page, user.email, TEST_PASSWORD);
      await page.getByRole('heading', { level: 1, name: heading }).waitFor();
      await expect(
        page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: nav }).count(),
      ).resolves.toBe(1);
      // The studio's pages are not offered to other roles.
      const clientsLinks = await page
        .getByRole('navigation', { name: 'Main' })
        .getByRole('link', { name: 'Clients', exact: true })
        .count();
      expect(clientsLinks).toBe(role === 'studio_admin' ? 1 : 0);
      expect(await seriousAxeViolations(page)).toEqual([]);
      await context.close();
    });
  }

  it('shows the error inline for a wrong password', async () => {
    const user = await insertStaff(env.testApp.db, { role: 'photographer' });
    const context = await env.newContext();
    const page = await context.newPage();
    await signInWithPassword(page, user.email, 'wrong password');
    await page.getByText('That e-mail and password do not match an active account.').waitFor();
    await context.close();
  });

  it('a sitter asks for a link, follows it from the mail catcher and sees their page', async () => {
    const office = await insertOffice(env.testApp.db, clientId, 'Porto', 'Europe/Lisbon');
    const person = await insertPerson(env.testApp.db, clientId, {
      officeId: office.id,
      givenName: 'Matilde',
    });
    const context = await env.newContext({
      viewport: { width: 390, height: 844 },
      isMobile: true,
      hasTouch: true,
    });
    const page = await context.newPage();
    await page.goto('/sign-in');
    const linkForm = page.getByRole('form', { name: 'Get a sign-in link' });
    await linkForm.getByLabel('Work e-mail').fill(person.email);
    await linkForm.getByRole('button', { name: 'E-mail me a sign-in link' }).click();
    await page.getByText(/a sign-in link is on its way/).waitFor();
    // The link is issued and mailed by the job queue, as the worker would run it.
    await sendQueuedLinks(env.testApp);

    const mail = await env.testApp.mail.waitFor(person.email);
    const url = /(http:\/\/\S+\/link\/\S+)/.exec(mail.text)?.[1];
    expect(url).toBeDefined();
    await page.goto(url as string);
    await page.getByRole('heading', { level: 1, name: 'Hello, Matilde' }).waitFor();
    await page.getByText('Halvorsen & Pike Engineering, Porto office').waitFor();
    expect(await seriousAxeViolations(page)).toEqual([]);

    // The same link a second time no longer works.
    const second = await env.newContext();
    const again = await second.newPage();
    await again.goto(url as string);
    await again.getByText('This link has already been used.', { exact: false }).waitFor();
    await second.close();
    await context.close();
  });

  it('sends a signed-out visitor to sign-in and back to the page they wanted', async () => {
    const admin = await insertStaff(env.testApp.db);
    const context = await env.newContext();
    const page = await context.newPage();
    await page.goto('/studio/team');
    await page.waitForURL(/\/sign-in\?next=%2Fstudio%2Fteam/);
    const form = page.getByRole('form', { name: 'Sign in with a password' });
    await form.getByLabel('E-mail').fill(admin.email);
    await form.getByLabel('Password').fill(TEST_PASSWORD);
    await form.getByRole('button', { name: 'Sign in' }).click();
    await page.getByRole('heading', { level: 1, name: 'Team' }).waitFor();
    await context.close();
  });

  it('shows a not-found page for unknown addresses', async () => {
    const context = await env.newContext();
    const page = await context.newPage();
    await page.goto('/no/such/page');
    await page.getByRole('heading', { name: 'There is no page at this address' }).waitFor();
    await context.close();
  });
});

describe('the account page', () => {
  it('lists where the account is signed in and signs out everywhere else', async () => {
    const user = await insertStaff(env.testApp.db, { role: 'photographer' });
    const lostTablet = await env.newContext();
    const tabletPage = await lostTablet.newPage();
    await signInWithPassword(tabletPage, user.email, TEST_PASSWORD);
    await tabletPage.getByRole('heading', { level: 1, name: /Hello,/ }).waitFor();

    const desk = await env.newContext();
    const page = await desk.newPage();
    await signInWithPassword(page, user.email, TEST_PASSWORD);
    await page.getByRole('heading', { level: 1, name: /Hello,/ }).waitFor();
    await page.getByRole('link', { name: 'Account' }).click();
    await page.getByRole('heading', { level: 1, name: 'Your account' }).waitFor();
    const sessions = page.getByRole('list', { name: 'Sessions' }).getByRole('listitem');
    await expect.poll(() => sessions.count()).toBe(2);
    await page.getByText('(this device)').waitFor();
    expect(await seriousAxeViolations(page)).toEqual([]);

    await page.getByRole('button', { name: 'Sign out everywhere else' }).click();
    await page.getByText('Signed out of 1 other session. This device stays signed in.').waitFor();
    await expect.poll(() => sessions.count()).toBe(1);

    // The other browser is signed out on its next request.
    await tabletPage.reload();
    await tabletPage.getByRole('heading', { name: 'Sign in' }).waitFor();
    await lostTablet.close();
    await desk.close();
  });
});
