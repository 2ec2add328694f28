import { execFileSync } from 'node:child_process';
import { mkdtempSync, rmSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { insertStaff, TEST_PASSWORD } from '../factories/accounts';
import { generateInvoiceDay } from '../server/invoices-day';
import {
  seriousAxeViolations,
  signInWithPassword,
  startE2e,
  type E2eEnvironment,
} from './support/browser';

let env: E2eEnvironment;
let generated: Awaited<ReturnType<typeof generateInvoiceDay>>;
let adminEmail: string;
const scratch = mkdtempSync(path.join(os.tmpdir(), 'likeness-invoice-e2e-'));

beforeAll(async () => {
  env = await startE2e();
  generated = await generateInvoiceDay(env.testApp.db, { clientName: 'Marrowgate Surveying' });
  adminEmail = (await insertStaff(env.testApp.db, { role: 'studio_admin' })).email;
}, 60_000);
afterAll(async () => {
  await env?.close();
  rmSync(scratch, { recursive: true, force: true });
});

describe('summary and invoice', () => {
  it('sets a price list, reads the day’s summary and chart, issues the invoice and downloads its PDF', async () => {
    const context = await env.newContext({ acceptDownloads: true });
    const page = await context.newPage();
    await signInWithPassword(page, adminEmail, TEST_PASSWORD);
    await page.getByRole('heading', { level: 1, name: /Good to see you/ }).waitFor();

    // The price list (the same as the server test's, typed as a person types it).
    await page.goto('/studio/clients');
    const card = page.locator('section', {
      has: page.getByRole('heading', { name: 'Marrowgate Surveying' }),
    });
    await card.getByText('Price list', { exact: true }).click();
    const form = card.getByRole('form', { name: 'Price list' });
    await form.getByLabel('Currency (ISO 4217)').fill('GBP');
    await form.getByLabel('Day rate (GBP)').fill('950');
    await form.getByLabel('Per station (GBP)').fill('125.00');
    await form.getByLabel('Per person photographed (GBP)').fill('18.50');
    await form.getByLabel('Per extra pick (GBP)').fill('12');
    await form.getByLabel('Per retouch (GBP)').fill('22.5');
    await form.getByLabel('Per extra rendition (GBP)').fill('2.98');
    await form.getByLabel('Renditions included per person').fill('2');
    await form.getByLabel('Tax rate (%)').fill('17.5');
    await form.getByRole('button', { name: 'Save the price list' }).click();
    await form.getByText('Price list saved.').waitFor();

    // The day's summary, from the day page.
    await page.goto(`/days/${generated.day.id}`);
    await page.getByRole('link', { name: 'Summary and invoice' }).click();
    await page.getByRole('heading', { level: 1, name: 'Summary and invoice' }).waitFor();
    const figure = async (label: string) =>
      page
        .getByLabel('Figures')
        .locator('div', { has: page.getByText(label, { exact: true }) })
        .locator('dd')
        .textContent();
    expect(await figure('Photographed')).toBe('4');
    expect(await figure('Walk-ins')).toBe('2');
    expect(await figure('Missed')).toBe('4');
    const chart = page.getByRole('img', { name: /Per office/ });
    expect(await chart.getAttribute('aria-label')).toBe(
      'Per office. Leeds: 4 booked, 3 photographed; York: 0 booked, 1 photographed',
    );
    // Two offices, two bars each.
    expect(await chart.locator('rect').count()).toBe(4);
    expect(await seriousAxeViolations(page)).toEqual([]);

    // Issue it and open it.
    await page.getByRole('button', { name: 'Issue the invoice' }).click();
    // One more step, as issuing freezes the lines.
    await page.getByText(/Once issued, the invoice keeps these lines/).waitFor();
    // Five picks, two retouched: the other three would not be billed.
    await page
      .getByText('3 picks are not retouched yet: they are not on this invoice.', { exact: false })
      .waitFor();
    await page.getByRole('button', { name: 'Issue it now' }).click();
    const year = new Date().getUTCFullYear();
    const number = `LK-${year}-0001`;
    await page.getByRole('link', { name: `Open invoice ${number}` }).click();
    await page.getByRole('heading', { level: 1, name: 'Invoice', exact: true }).waitFor();
    const rows = await page.getByRole('table').locator('tbody tr').allInnerTexts();
    expect(rows.map((row) => row.split('\t').map((cell) => cell.trim()))).toEqual([
      ['Shoot day', '1', '£950.00', '£950.00'],
      ['Stations', '2', '£125.00', '£250.00'],
      ['People photographed', '4', '£18.50', '£74.00'],
      ['Extra picks', '2', '£12.00', '£24.00'],
      ['Retouches', '2', '£22.50', '£45.00'],
      ['Extra rendition', '1', '£2.98', '£2.98'],
    ]);
    await page.getByText('£1,581.53').waitFor();
    expect(await seriousAxeViolations(page)).toEqual([]);

    const [download] = await Promise.all([
      page.waitForEvent('download'),
      page.getByRole('link', { name: 'Download PDF' }).click(),
    ]);
    expect(download.suggestedFilename()).toBe(`${number}.pdf`);
    const file = path.join(scratch, 'invoice.pdf');
    await download.saveAs(file);
    const text = execFileSync('pdftotext', [file, '-'], { encoding: 'utf8' });
    expect(text).toContain(number);
    expect(text).toContain('Marrowgate Surveying');
    expect(text).toContain('£1,581.53');
    await context.close();
  });
});
