import type request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { insertClient, insertStaff } from '../factories/accounts';
import { startTestApp, type TestApp } from '../setup/test-app';
import { signedInAgent } from './helpers';
import { generateInvoiceDay, testPrices } from './invoices-day';

let t: TestApp;
let studio: request.Agent;
let coordinator: request.Agent;
let stranger: request.Agent;
let generated: Awaited<ReturnType<typeof generateInvoiceDay>>;
let invoiceId: string;

beforeAll(async () => {
  t = await startTestApp();
  generated = await generateInvoiceDay(t.db);
  const elsewhere = await insertClient(t.db);
  studio = await signedInAgent(t, (await insertStaff(t.db, { role: 'studio_admin' })).email);
  coordinator = await signedInAgent(
    t,
    (await insertStaff(t.db, { role: 'coordinator', clientId: generated.client.id })).email,
  );
  stranger = await signedInAgent(
    t,
    (await insertStaff(t.db, { role: 'coordinator', clientId: elsewhere.id })).email,
  );
  await studio.put(`/api/clients/${generated.client.id}/price-list`).send(testPrices).expect(200);
  // Two issuers at once: one invoice, one number.
  const [first, second] = await Promise.all([
    studio.post(`/api/days/${generated.day.id}/invoice`).send({}),
    studio.post(`/api/days/${generated.day.id}/invoice`).send({}),
  ]);
  expect([first!.status, second!.status].sort()).toEqual([200, 201]);
  expect(first!.body.invoice).toEqual(second!.body.invoice);
  invoiceId = first!.body.invoice.id;
});
afterAll(() => t?.close());

describe('who may see and change invoices', () => {
  it('lets the client’s coordinator read figures, prices and invoices, and change nothing', async () => {
    await coordinator.get(`/api/days/${generated.day.id}/summary`).expect(200);
    await coordinator.get(`/api/clients/${generated.client.id}/summary`).expect(200);
    const prices = await coordinator.get(`/api/clients/${generated.client.id}/price-list`);
    expect(prices.body).toMatchObject({ saved: true, priceList: testPrices });
    await coordinator.get(`/api/invoices/${invoiceId}`).expect(200);
    await coordinator.get(`/api/invoices/${invoiceId}/invoice.csv`).expect(200);
    await coordinator.get(`/api/invoices/${invoiceId}/invoice.pdf`).expect(200);
    await coordinator
      .put(`/api/clients/${generated.client.id}/price-list`)
      .send({ ...testPrices, dayRateMinor: 0 })
      .expect(403);
    await coordinator.post(`/api/days/${generated.day.id}/invoice`).send({}).expect(403);
    const saved = await t.db.selectFrom('priceLists').select('dayRateMinor').execute();
    expect(saved).toEqual([{ dayRateMinor: testPrices.dayRateMinor }]);
  });

  it('tells another client’s coordinator nothing, not even that it exists', async () => {
    for (const path of [
      `/api/days/${generated.day.id}/summary`,
      `/api/clients/${generated.client.id}/summary`,
      `/api/clients/${generated.client.id}/price-list`,
      `/api/invoices/${invoiceId}`,
      `/api/invoices/${invoiceId}/invoice.csv`,
      `/api/invoices/${invoiceId}/invoice.pdf`,
    ]) {
      const response = await stranger.get(path);
      expect(response.status, path).toBe(404);
    }
  });

  it('answers 404 for what does not exist, well formed or not', async () => {
    const unknown = '00000000-0000-4000-8000-000000000009';
    await studio.get(`/api/days/${unknown}/summary`).expect(404);
    await studio.get('/api/days/not-an-id/summary').expect(404);
    await studio.get(`/api/clients/${unknown}/summary`).expect(404);
    await studio.get(`/api/invoices/${unknown}`).expect(404);
    await studio.get(`/api/invoices/${unknown}/invoice.pdf`).expect(404);
    await studio.put(`/api/clients/${unknown}/price-list`).send(testPrices).expect(404);
    await studio.post(`/api/days/${unknown}/invoice`).send({}).expect(404);
  });
});

describe('bad input', () => {
  it('says what is wrong with a price list, and keeps the one saved', async () => {
    const response = await studio
      .put(`/api/clients/${generated.client.id}/price-list`)
      .send({
        ...testPrices,
        currency: 'POUNDS',
        dayRateMinor: 950.5,
        perStationMinor: -1,
        perPersonMinor: '1850',
        taxRateBasisPoints: 20_000,
        renditionsIncluded: 51,
      })
      .expect(400);
    expect(response.body.error.code).toBe('invalid_input');
    expect(response.body.error.details.fieldErrors).toEqual({
      currency: ['Give the currency as a three-letter code, like GBP or EUR.'],
      dayRateMinor: ['Give the day rate as a whole number of minor units.'],
      perStationMinor: ['A price cannot be negative.'],
      perPersonMinor: ['Give the price per person photographed as a whole number of minor units.'],
      taxRateBasisPoints: ['A tax rate is at most 100%.'],
      renditionsIncluded: ['At most 50 renditions.'],
    });
    const unknownField = await studio
      .put(`/api/clients/${generated.client.id}/price-list`)
      .send({ ...testPrices, discount: 10 })
      .expect(400);
    expect(unknownField.body.error.details.formErrors[0]).toMatch(/discount/);
    await studio
      .put(`/api/clients/${generated.client.id}/price-list`)
      .send({ ...testPrices, currency: 'XYZ' })
      .expect(400);
    await studio
      .put(`/api/clients/${generated.client.id}/price-list`)
      .set('Content-Type', 'text/plain')
      .send('currency=GBP')
      .expect(415);
    const saved = await t.db.selectFrom('priceLists').selectAll().execute();
    expect(saved).toHaveLength(1);
    expect(saved[0]).toMatchObject(testPrices);
  });

  it('takes no options when issuing, and issues nothing when given some', async () => {
    const other = await generateInvoiceDay(t.db);
    await studio.put(`/api/clients/${other.client.id}/price-list`).send(testPrices).expect(200);
    await studio
      .post(`/api/days/${other.day.id}/invoice`)
      .send({ number: 'LK-1999-0001' })
      .expect(400);
    const invoices = await t.db.selectFrom('invoices').select('dayId').execute();
    expect(invoices).toEqual([{ dayId: generated.day.id }]);
  });
});
