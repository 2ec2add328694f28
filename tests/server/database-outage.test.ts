import http from 'node:http';
import type { AddressInfo } from 'node:net';
import pg from 'pg';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { insertClient, insertOffice, insertStaff, TEST_PASSWORD } from '../factories/accounts';
import { insertDayWithStations } from '../factories/shoot-days';
import { createStoppableDatabase, type StoppableDatabase } from '../setup/stoppable-database';
import { startTestApp, type TestApp } from '../setup/test-app';

// PostgreSQL is stopped (fast shutdown: connections cut, as in an outage) while a request waits
// on a lock, then started again. Requests must answer 503 with Retry-After (RFC 9110 §10.2.3),
// never 500, and the LISTEN connection for live console updates must come back by itself.

let database: StoppableDatabase;
let t: TestApp;
let server: http.Server;
let baseUrl: string;
let cookie: string;
let dayId: string;
let stationId: string;

beforeAll(async () => {
  database = await createStoppableDatabase();
  t = await startTestApp({ database, reconnect: { firstDelayMs: 50, maxDelayMs: 250 } });
  server = http.createServer(t.app);
  await new Promise<void>((resolve) => server.listen(0, '127.0.0.1', resolve));
  baseUrl = `http://127.0.0.1:${(server.address() as AddressInfo).port}`;
  const client = await insertClient(t.db);
  const office = await insertOffice(t.db, client.id);
  const admin = await insertStaff(t.db, { role: 'studio_admin' });
  const day = await insertDayWithStations(t.db, {
    clientId: client.id,
    officeId: office.id,
    photographerIds: [null],
  });
  dayId = day.dayId;
  stationId = day.stations[0]!.id;
  const signIn = await request(t.app)
    .post('/api/session')
    .send({ email: admin.email, password: TEST_PASSWORD })
    .expect(201);
  cookie = (signIn.headers['set-cookie'] as unknown as string[])
    .map((line) => line.split(';')[0])
    .join('; ');
});

afterAll(async () => {
  await new Promise<void>((resolve) => {
    server.close(() => resolve());
    server.closeAllConnections();
  });
  await t.close();
});

function openEventStream() {
  const received: string[] = [];
  const stream = http.get(`${baseUrl}/api/days/${dayId}/console/events?stationId=${stationId}`, {
    headers: { Cookie: cookie },
  });
  stream.on('response', (response) => {
    response.setEncoding('utf8');
    response.on('data', (chunk: string) => received.push(chunk));
  });
  stream.on('error', () => undefined);
  return { text: () => received.join(''), close: () => stream.destroy() };
}

async function health() {
  return request(t.app).get('/api/health').set('Cookie', cookie);
}

describe('the database stopped mid-request and started again', () => {
  it('answers 503 with a retry hint, then recovers, and the listener comes back', async () => {
    const events = openEventStream();
    await expect.poll(events.text).toMatch(/event: ready/);
    const before = await health();
    expect(before.status).toBe(200);
    expect(before.body.listener).toEqual({ state: 'listening', reconnects: 0, failedAttempts: 0 });

    // Hold the sessions table so a signed-in request is inside the database when it stops.
    const blocker = new pg.Client({ connectionString: database.url });
    blocker.on('error', () => undefined);
    await blocker.connect();
    await blocker.query('begin');
    await blocker.query('lock table sessions in access exclusive mode');
    const inFlight = request(t.app)
      .get('/api/clients')
      .set('Cookie', cookie)
      .then((r) => r);
    await expect
      .poll(async () => {
        const waiting = await blocker.query(
          `select count(*)::int as n from pg_stat_activity where wait_event_type = 'Lock'`,
        );
        return (waiting.rows[0] as { n: number }).n;
      })
      .toBeGreaterThan(0);

    database.stopServer();

    const cut = await inFlight;
    expect(cut.status).toBe(503);
    expect(cut.headers['retry-after']).toBe('5');
    expect(cut.body.error.code).toBe('database_unavailable');
    expect(cut.body.error.message).toMatch(/cannot reach its database, retrying/);

    // New requests while it is down: refused connections are an outage too.
    const refused = await request(t.app).get('/api/clients').set('Cookie', cookie);
    expect(refused.status).toBe(503);
    expect(refused.headers['retry-after']).toBe('5');
    const down = await health();
    expect(down.status).toBe(503);
    expect(down.headers['retry-after']).toBe('5');
    expect(down.body.database.state).toBe('down');
    expect(down.body.listener.state).toBe('reconnecting');
    expect(down.body.status).toBe('degraded');
    const notReady = await request(t.app).get('/api/ready');
    expect(notReady.status).toBe(503);
    expect(notReady.body).toMatchObject({ ready: false, database: 'down' });

    // Several reconnection attempts fail while it stays down; the listener keeps trying.
    await expect.poll(() => t.notifications.status().failedAttempts).toBeGreaterThanOrEqual(3);
    expect(t.notifications.status().state).toBe('reconnecting');
    await database.startServer();

    await expect
      .poll(async () => (await health()).body.listener?.state, { timeout: 10_000 })
      .toBe('listening');
    const after = await health();
    expect(after.status).toBe(200);
    expect(after.body.status).toBe('ok');
    expect(after.body.listener.reconnects).toBeGreaterThanOrEqual(1);
    await request(t.app).get('/api/clients').set('Cookie', cookie).expect(200);

    // The open stream is told to reload everything (changes during the outage went unheard) ...
    await expect.poll(events.text).toMatch(/event: changed\ndata: \{[^}]*"refresh":true/);
    // ... and hears the next change through the re-made LISTEN.
    const heard = events.text().length;
    await t.db.executeQuery(
      // A NOTIFY as a service sends it inside its transaction.
      (await import('kysely')).sql`select pg_notify('station_console', ${dayId})`.compile(t.db),
    );
    await expect
      .poll(() => events.text().slice(heard))
      .toMatch(new RegExp(`event: changed\\ndata: \\{"dayId":"${dayId}"\\}`));
    events.close();
  });
});
