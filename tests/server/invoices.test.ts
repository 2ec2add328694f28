import { execFileSync } from 'node:child_process';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { sql } from 'kysely';
import type request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { renditionsDelivered } from '../../server/modules/invoices/invoices.repository';
import { insertStaff } from '../factories/accounts';
import { startTestApp, type TestApp } from '../setup/test-app';
import { signedInAgent } from './helpers';
import { generateInvoiceDay, testPrices } from './invoices-day';

let t: TestApp;
let studio: request.Agent;
let generated: Awaited<ReturnType<typeof generateInvoiceDay>>;
let year: number;
const scratch = mkdtempSync(path.join(os.tmpdir(), 'likeness-invoices-'));

beforeAll(async () => {
  t = await startTestApp();
  generated = await generateInvoiceDay(t.db);
  studio = await signedInAgent(t, (await insertStaff(t.db, { role: 'studio_admin' })).email);
  year = t.clock.now().getUTCFullYear();
});
afterAll(async () => {
  await t?.close();
  rmSync(scratch, { recursive: true, force: true });
});

// The invoice for the generated day (see invoices-day.ts), worked out by hand in pence:
//   Shoot day             1 × 95000 = 95000
//   Stations              2 × 12500 = 25000
//   People photographed   4 ×  1850 =  7400   (A, B, Y, W)
//   Extra picks           2 ×  1200 =  2400   (A's second and third)
//   Retouches             2 ×  2250 =  4500   (A's first, Y's)
//   Extra rendition       1 ×   298 =   298   (A's third rendition; 2 included)
//   Subtotal 95000 + 25000 + 7400 + 2400 + 4500 + 298 = 134598
//   Tax 17.5%: 134598 × 1750 / 10000 = 23554.65 → half up 23555
//   Total 134598 + 23555 = 158153 (£1,581.53)
const expectedLines = [
  { kind: 'day_rate', description: 'Shoot day', quantity: 1, unitMinor: 95000, amountMinor: 95000 },
  { kind: 'stations', description: 'Stations', quantity: 2, unitMinor: 12500, amountMinor: 25000 },
  {
    kind: 'people',
    description: 'People photographed',
    quantity: 4,
    unitMinor: 1850,
    amountMinor: 7400,
  },
  {
    kind: 'extra_picks',
    description: 'Extra picks',
    quantity: 2,
    unitMinor: 1200,
    amountMinor: 2400,
  },
  { kind: 'retouches', description: 'Retouches', quantity: 2, unitMinor: 2250, amountMinor: 4500 },
  {
    kind: 'extra_renditions',
    description: 'Extra rendition',
    quantity: 1,
    unitMinor: 298,
    amountMinor: 298,
  },
];
const expectedTotals = { subtotalMinor: 134598, taxMinor: 23555, totalMinor: 158153 };

const binary = (res: request.Response, done: (error: Error | null, body: Buffer) => void) => {
  const chunks: Buffer[] = [];
  res.on('data', (chunk: Buffer) => chunks.push(chunk));
  res.on('end', () => done(null, Buffer.concat(chunks)));
};

describe('summary and invoice of a generated day', () => {
  it('counts every figure from the day’s own records', async () => {
    const summary = (await studio.get(`/api/days/${generated.day.id}/summary`).expect(200)).body;
    expect(summary.counts).toEqual({
      invited: 6, // A–F: Leeds's active people; not the inactive one, Y (York) or W (added that day)
      booked: 4, // A–D; E cancelled
      checkedIn: 4, // A, B, Y, W; C's check-in was undone
      walkIns: 2, // Y (walk_in), W (new_person)
      photographed: 4, // A (twice, counted once), B (one sitting undone), Y, W
      noShows: 1, // D; C's no-show was undone
      missed: 4, // C, D, E, F: invited, never photographed
      picks: 5,
      extraPicks: 2,
      retouchesDone: 2,
      renditionsDelivered: 4,
      extraRenditions: 4, // no price list yet, so none are included
      stations: 2,
    });
    expect(summary.byOffice).toEqual([
      { label: 'Leeds', invited: 6, booked: 4, photographed: 3 },
      { label: 'York', invited: 0, booked: 0, photographed: 1 },
    ]);
    expect(summary.draft).toBeNull();
    expect(summary.invoice).toBeNull();
  });

  it('refuses to issue without a price list, and writes nothing', async () => {
    const refused = await studio.post(`/api/days/${generated.day.id}/invoice`).send({}).expect(409);
    expect(refused.body.error.code).toBe('no_price_list');
    expect(await t.db.selectFrom('invoices').selectAll().execute()).toEqual([]);
    expect(await t.db.selectFrom('invoiceSequences').selectAll().execute()).toEqual([]);
  });

  it('starts a price list from the package, saves it, and shows the lines it gives', async () => {
    const first = await studio.get(`/api/clients/${generated.client.id}/price-list`).expect(200);
    expect(first.body.saved).toBe(false);
    const saved = await studio
      .put(`/api/clients/${generated.client.id}/price-list`)
      .send(testPrices)
      .expect(200);
    expect(saved.body).toMatchObject({ saved: true, priceList: testPrices });
    const summary = (await studio.get(`/api/days/${generated.day.id}/summary`).expect(200)).body;
    // A had three renditions with two included.
    expect(summary.counts.extraRenditions).toBe(1);
    expect(summary.draft).toEqual({
      currency: 'GBP',
      lines: expectedLines,
      taxRateBasisPoints: 1750,
      ...expectedTotals,
    });
  });

  it('issues the invoice once, with a stable number and the lines checked by hand', async () => {
    const issued = await studio.post(`/api/days/${generated.day.id}/invoice`).send({}).expect(201);
    const number = `LK-${year}-0001`;
    expect(issued.body).toMatchObject({ created: true, invoice: { number } });
    const again = await studio.post(`/api/days/${generated.day.id}/invoice`).expect(200);
    expect(again.body).toEqual({ created: false, invoice: issued.body.invoice });

    const invoice = (await studio.get(`/api/invoices/${issued.body.invoice.id}`).expect(200)).body;
    expect(invoice).toMatchObject({
      number,
      dayId: generated.day.id,
      clientName: generated.client.name,
      officeName: 'Leeds',
      dayDate: '2030-03-14',
      currency: 'GBP',
      taxRateBasisPoints: 1750,
      ...expectedTotals,
    });
    expect(invoice.lines).toEqual(expectedLines);

    // A later price change leaves the issued invoice as it was.
    await studio
      .put(`/api/clients/${generated.client.id}/price-list`)
      .send({ ...testPrices, dayRateMinor: 1 })
      .expect(200);
    const reprinted = (await studio.get(`/api/invoices/${invoice.id}`).expect(200)).body;
    expect(reprinted).toEqual(invoice);
    const summary = (await studio.get(`/api/days/${generated.day.id}/summary`).expect(200)).body;
    expect(summary.invoice).toEqual(issued.body.invoice);

    // The database itself refuses to change an issued invoice.
    await expect(
      sql`update invoices set total_minor = 0, subtotal_minor = 0, tax_minor = 0`.execute(t.db),
    ).rejects.toThrow(/never changed/);
  });

  it('numbers the next invoice of the year in sequence, whatever the client', async () => {
    const other = await generateInvoiceDay(t.db, { clientName: '=HYPERLINK("x") Portraits' });
    await studio.put(`/api/clients/${other.client.id}/price-list`).send(testPrices).expect(200);
    const issued = await studio.post(`/api/days/${other.day.id}/invoice`).expect(201);
    expect(issued.body.invoice.number).toBe(`LK-${year}-0002`);

    // CSV: the same lines, amounts as decimals, and a formula-like client name kept as text.
    const csv = await studio.get(`/api/invoices/${issued.body.invoice.id}/invoice.csv`).expect(200);
    expect(csv.headers['content-type']).toBe('text/csv; charset=utf-8');
    expect(csv.text.split('\r\n')).toEqual([
      `\uFEFFInvoice,LK-${year}-0002`,
      `Issued,${issued.body.invoice.issuedAt.slice(0, 10)}`,
      // The studio issuing it, from STUDIO_NAME and STUDIO_ADDRESS (their defaults here).
      'From,Northlight Portrait Co.',
      'Address,"12 Lantern Yard, Leeds"',
      `Client,"'=HYPERLINK(""x"") Portraits"`,
      'Shoot day,Leeds 2030-03-14',
      'Currency,GBP',
      '',
      'Description,Quantity,Unit price,Amount',
      'Shoot day,1,950.00,950.00',
      'Stations,2,125.00,250.00',
      'People photographed,4,18.50,74.00',
      'Extra picks,2,12.00,24.00',
      'Retouches,2,22.50,45.00',
      'Extra rendition,1,2.98,2.98',
      'Subtotal,,,1345.98',
      'Tax 17.5%,,,235.55',
      'Total,,,1581.53',
      '',
    ]);
  });

  it('prints the invoice as a PDF with Work Sans embedded (read back by poppler)', async () => {
    const [row] = await t.db
      .selectFrom('invoices')
      .select('id')
      .where('dayId', '=', generated.day.id)
      .execute();
    const pdf = await studio
      .get(`/api/invoices/${row!.id}/invoice.pdf`)
      .buffer(true)
      .parse(binary)
      .expect(200);
    expect(pdf.headers['content-type']).toBe('application/pdf');
    const file = path.join(scratch, 'invoice.pdf');
    writeFileSync(file, pdf.body as Buffer);
    const text = execFileSync('pdftotext', ['-layout', file, '-'], { encoding: 'utf8' });
    const lines = text.split('\n').map((line) => line.trim().replace(/\s{2,}/g, ' | '));
    expect(lines).toContain(`LK-${year}-0001 | Issued ${t.clock.now().toISOString().slice(0, 10)}`);
    expect(lines.some((line) => line.endsWith('Northlight Portrait Co.'))).toBe(true);
    expect(lines.some((line) => line.endsWith('12 Lantern Yard, Leeds'))).toBe(true);
    expect(lines.some((line) => line.startsWith(generated.client.name))).toBe(true);
    expect(lines).toContain('Leeds · 2030-03-14');
    for (const expected of [
      'Shoot day | 1 | £950.00 | £950.00',
      'Stations | 2 | £125.00 | £250.00',
      'People photographed | 4 | £18.50 | £74.00',
      'Extra picks | 2 | £12.00 | £24.00',
      'Retouches | 2 | £22.50 | £45.00',
      'Extra rendition | 1 | £2.98 | £2.98',
      'Subtotal | £1,345.98',
      'Tax 17.5% | £235.55',
      'Total GBP | £1,581.53',
    ]) {
      expect(lines).toContain(expected);
    }
    const fonts = execFileSync('pdffonts', [file], { encoding: 'utf8' });
    expect(fonts).toMatch(/\+WorkSans-Regular\s+CID TrueType\s+Identity-H\s+yes yes yes/);
    expect(fonts).toMatch(/\+WorkSans-SemiBold\s+CID TrueType\s+Identity-H\s+yes yes yes/);
  });

  it('sums the client’s days', async () => {
    const summary = (await studio.get(`/api/clients/${generated.client.id}/summary`).expect(200))
      .body;
    expect(summary.days).toHaveLength(1);
    expect(summary.days[0]).toMatchObject({ dayId: generated.day.id, officeName: 'Leeds' });
    expect(summary.totals).toMatchObject({ invited: 6, booked: 4, photographed: 4, picks: 5 });
    expect(summary.days[0].invoice.number).toBe(`LK-${year}-0001`);
  });

  it('counts no renditions while the delivery table does not exist', async () => {
    expect(await renditionsDelivered(t.db, generated.day.id)).toBe(4);
    await sql`drop table delivered_renditions`.execute(t.db);
    expect(await renditionsDelivered(t.db, generated.day.id)).toBe(0);
    const summary = (await studio.get(`/api/days/${generated.day.id}/summary`).expect(200)).body;
    expect(summary.counts).toMatchObject({ renditionsDelivered: 0, extraRenditions: 0 });
  });
});
