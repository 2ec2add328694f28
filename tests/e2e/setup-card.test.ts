import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { insertClient, insertOffice, insertStaff, TEST_PASSWORD } from '../factories/accounts';
import { insertDayWithStations } from '../factories/shoot-days';
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

describe('setup card', () => {
  it('a photographer edits a card, sees the warnings change, copies it and prints', async () => {
    const context = await env.newContext({ viewport: { width: 1280, height: 1000 } });
    const page = await context.newPage();
    await signInWithPassword(page, photographerEmail, TEST_PASSWORD);
    await page.getByRole('heading', { level: 1, name: /Hello,/ }).waitFor();
    await page.goto(`/days/${dayId}/setup`);
    await page.getByRole('heading', { level: 1, name: 'Setup cards' }).waitFor();
    const warnings = page.getByRole('region', { name: 'Warnings' });
    await warnings.getByText('No warnings for this card.').waitFor();
    // The starter card sits at about 3:1 key-to-fill, both conventions named, and says what
    // its figures assume (equal heads without guide numbers; an in-line key for the background).
    await page.getByText('Lighting ratio (key+fill : fill)').waitFor();
    await page.getByText('Key-to-fill', { exact: true }).waitFor();
    expect(await page.getByText('2.8:1', { exact: true }).count()).toBe(1);
    const assumptions = page.getByRole('region', { name: 'Assumptions' });
    await assumptions.getByText(/assume heads of equal output/).waitFor();
    await assumptions.getByText(/background fall-off is approximate/).waitFor();

    // Stand the sitter 1 m from the background: the shadow warning appears.
    const form = page.getByRole('form', { name: 'Setup card' });
    await form.getByLabel('Sitter to background').fill('1');
    await warnings.getByText(/closer than 1.5 m to the background/).waitFor();
    // Push ISO up too: a second warning joins the first.
    await form.getByLabel('ISO', { exact: true }).fill('800');
    await warnings.getByText(/ISO above 100, the base of most bodies/).waitFor();
    expect(await warnings.getByRole('listitem').count()).toBe(2);
    // A background light is placed by its distance to the background, not to the sitter.
    await form.getByRole('button', { name: 'Add a background light' }).click();
    await form
      .getByRole('group', { name: 'Background light' })
      .getByLabel('Distance to background')
      .waitFor();
    expect(await seriousAxeViolations(page)).toEqual([]);

    await form.getByRole('button', { name: 'Save card' }).click();
    await page.getByText(/^Last saved/).waitFor();

    // Copy Station 1's card onto Station 2.
    await page.getByRole('tab', { name: /Station 2/ }).click();
    await page.getByRole('tab', { name: 'Station 2 (no card yet)', selected: true }).waitFor();
    const copyForm = page.getByRole('form', { name: 'Copy a card' });
    const option = await copyForm
      .getByLabel('Copy from')
      .locator('option', { hasText: 'Station 1' })
      .getAttribute('value');
    await copyForm.getByLabel('Copy from').selectOption(option ?? '');
    await copyForm.getByRole('button', { name: 'Copy to Station 2' }).click();
    await page.getByRole('tab', { name: 'Station 2', exact: true }).waitFor();
    await expect(
      page
        .getByRole('form', { name: 'Setup card' })
        .getByLabel('ISO', { exact: true })
        .inputValue(),
    ).resolves.toBe('800');

    await page.getByRole('link', { name: 'Print view' }).click();
    await page.getByRole('heading', { level: 1, name: /Setup card · Station 1/ }).waitFor();
    expect(await page.getByRole('img', { name: /Plan sketch/ }).count()).toBe(2);
    expect(await page.getByText(/Sandbag every light stand/).count()).toBe(2);
    expect(await page.getByText(/A light on a boom over a sitter/).count()).toBe(2);
    expect(await page.getByText(/every other station in the same room holds/).count()).toBe(2);
    await context.close();
  });
});
