import { spawnSync } from 'node:child_process';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import type { Server } from 'node:http';
import { Worker } from 'node:worker_threads';
import type { AddressInfo } from 'node:net';
import { tmpdir } from 'node:os';
import path from 'node:path';
import cookieParser from 'cookie-parser';
import express from 'express';
import pg from 'pg';
import { systemClock } from '../server/adapters/clock';
import { LocalStorage } from '../server/adapters/storage/local-storage';
import type { Mailer } from '../server/adapters/mail/mailer';
import { createApp } from '../server/app';
import { parseEnvironment, toAppConfig } from '../server/config';
import { createDatabase, DEFAULT_POOL_SIZE } from '../server/db/database';
import { migrateToLatest } from '../server/db/migrator';
import { createLogger } from '../server/lib/logger';
import { hashToken, newOpaqueToken } from '../server/lib/secrets';
import { generateSlots } from '../server/modules/days/slots';
import type { Benchmark } from './run';

/**
 * booking-burst: 2,000 invented sitters, each signed in, claim a slot over HTTP on loopback
 * against one day with 4 stations (96 five-minute slots, 384 seats), CONCURRENCY requests in
 * flight. The same claims go first to a bare Express + pg handler in this process (the session
 * by its hash, one INSERT ... ON CONFLICT DO NOTHING), then to the app; pgbench then runs a
 * one-row insert with the same unique-seat rule at the same concurrency. The app's claims are
 * real: the session, the day and invitation checks, the claim statement with its locks and the
 * confirmation job queued (the worker that would send it does not run here).
 */
const sitters = Number(process.env.BOOKING_BENCH_SITTERS ?? 2000);
const stations = 4;
// In-flight requests, and pgbench's client count; override to explore.
const concurrency = Number(process.env.BOOKING_BENCH_CONCURRENCY ?? 32);
// Connections of the app (and of the bare handler): the app's default unless asked.
const poolSize = Number(process.env.BOOKING_BENCH_POOL ?? DEFAULT_POOL_SIZE);
const pgbenchSeconds = Number(process.env.BOOKING_BENCH_PGBENCH_SECONDS ?? 10);
const date = '2030-03-14';
const nextDate = '2030-03-15';
const hours = { opensAt: '09:00', closesAt: '17:00', slotMinutes: 5 };

/** A small deterministic generator (mulberry32), so every run asks for the same slots. */
function repeatableRandom(start: number) {
  let state = start >>> 0;
  return () => {
    state = (state + 0x6d2b79f5) >>> 0;
    let t = state;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

const percentile = (sorted: number[], p: number) =>
  sorted[Math.min(sorted.length - 1, Math.ceil((p / 100) * sorted.length) - 1)] ?? 0;
const round = (value: number, digits = 1) => Number(value.toFixed(digits));

const discardingMailer: Mailer = { send: async () => undefined, close: () => undefined };

async function prepareDay(url: string) {
  const client = new pg.Client({ connectionString: url });
  await client.connect();
  try {
    const one = async (text: string, values: unknown[] = []) =>
      (await client.query(text, values)).rows[0] as { id: string };
    const company = await one(
      `insert into clients (name, slug) values ('Halvorsen & Pike Engineering', 'halvorsen-pike') returning id`,
    );
    const office = await one(
      `insert into offices (client_id, name, time_zone) values ($1, 'Leeds', 'Europe/London') returning id`,
      [company.id],
    );
    const day = await one(
      `insert into shoot_days (client_id, office_id, day_date, time_zone, address, room, opens_at,
         closes_at, slot_minutes, booking_opens_at, booking_closes_at, changes_close_at, invite_by, status)
       values ($1, $2, $3, 'Europe/London', '4 Quillfield Row, Leeds', 'Studio', $4, $5, $6,
         now() - interval '1 day', $3::date, $3::date, 'office', 'confirmed') returning id`,
      [company.id, office.id, date, hours.opensAt, hours.closesAt, hours.slotMinutes],
    );
    for (let index = 0; index < stations; index += 1) {
      const photographer = await one(
        `insert into users (email, display_name, role) values ($1, $2, 'photographer') returning id`,
        [`photographer${index}@northlight.example`, `Photographer ${index + 1}`],
      );
      await client.query(
        `insert into stations (day_id, position, name, photographer_id) values ($1, $2, $3, $4)`,
        [day.id, index + 1, `Station ${String.fromCharCode(65 + index)}`, photographer.id],
      );
    }
    // A second day of the same office, one station, for the untimed warm-up's claims.
    const warmDay = await one(
      `insert into shoot_days (client_id, office_id, day_date, time_zone, address, room, opens_at,
         closes_at, slot_minutes, booking_opens_at, booking_closes_at, changes_close_at, invite_by, status)
       values ($1, $2, $3::date + 1, 'Europe/London', '4 Quillfield Row, Leeds', 'Studio', $4, $5, $6,
         now() - interval '1 day', $3::date, $3::date, 'office', 'confirmed') returning id`,
      [company.id, office.id, date, hours.opensAt, hours.closesAt, hours.slotMinutes],
    );
    const warmPhotographer = await one(
      `insert into users (email, display_name, role) values ('warm-up@northlight.example', 'Warm-up', 'photographer') returning id`,
    );
    await client.query(
      `insert into stations (day_id, position, name, photographer_id) values ($1, 1, 'Station A', $2)`,
      [warmDay.id, warmPhotographer.id],
    );
    // Invented sitters and a session each (what redeeming an invitation link would leave).
    const tokens = Array.from({ length: sitters }, () => newOpaqueToken());
    await client.query(
      `with people_rows as (
         insert into people (client_id, office_id, given_name, family_name, email)
         select $1, $2, 'Sitter', 'No. ' || n, 'sitter' || n || '@halvorsen-pike.example'
         from generate_series(1, $3::int) n returning id, family_name)
       insert into sessions (token_hash, person_id, expires_at)
       select ($4::text[])[substring(family_name from 5)::int], id, now() + interval '1 day'
       from people_rows`,
      [company.id, office.id, sitters, tokens.map(hashToken)],
    );
    return { dayId: day.id, warmDayId: warmDay.id, tokens };
  } finally {
    await client.end();
  }
}

/**
 * The bare handler: an Express route in this process that does the least a claim can do —
 * read the JSON body and the session cookie, find the session in its table (by the token's
 * SHA-256, as the app does) and run one INSERT ... ON CONFLICT DO NOTHING — with no rules, no
 * transaction and no confirmation. It is the same HTTP, Node and pg stack the app runs on.
 */
async function startBareHandler(pool: pg.Pool): Promise<{ url: string; server: Server }> {
  await pool.query(
    `create table bare_claims (
       person_id uuid not null, day_id uuid not null, starts_at timestamptz not null,
       primary key (person_id, day_id))`,
  );
  const app = express();
  app.use(express.json());
  app.use(cookieParser());
  app.post('/claims', async (req, res) => {
    const token = String((req.cookies as Record<string, unknown>).likeness_session ?? '');
    const session = await pool.query<{ personId: string }>(
      'select person_id as "personId" from sessions where token_hash = $1 and expires_at > now()',
      [hashToken(token)],
    );
    const personId = session.rows[0]?.personId;
    if (!personId) {
      res.status(401).end();
      return;
    }
    const body = req.body as { dayId: string; startsAt: string };
    const inserted = await pool.query(
      `insert into bare_claims (person_id, day_id, starts_at) values ($1, $2, $3)
       on conflict do nothing`,
      [personId, body.dayId, body.startsAt],
    );
    res.status(inserted.rowCount ? 201 : 409).json({ personId, startsAt: body.startsAt });
  });
  const server = app.listen(0, '127.0.0.1');
  await new Promise((resolve) => server.once('listening', resolve));
  return { url: `http://127.0.0.1:${(server.address() as AddressInfo).port}/claims`, server };
}

/**
 * Where the claims' database time went (pg_stat_statements, planning included): the share of
 * the burst's wall time spent in PostgreSQL, and the statements that took most of it (nested
 * ones too, such as the add_jobs inside the claim, which is part of the claim's own time).
 */
async function databaseTimeOfClaims(client: pg.Client, seconds: number) {
  const { rows } = await client.query<{
    calls: string;
    ms: number;
    planMs: number;
    query: string;
    allMs: number;
  }>(
    `select calls, total_exec_time + total_plan_time as ms, total_plan_time as "planMs", query,
       sum(total_exec_time + total_plan_time) filter (where toplevel) over () as "allMs"
     from pg_stat_statements
     where query not like '%pg_stat_statements%'
       and dbid = (select oid from pg_database where datname = current_database())
     order by ms desc limit 6`,
  );
  return {
    // Busy database time (top-level statements: nested ones are inside them) over the burst's
    // wall time; the 64 warm-up claims are counted in, so it leans a little high.
    db_busy_share: round((rows[0]?.allMs ?? 0) / (seconds * 1000), 2),
    top: rows.map((row) => ({
      calls: Number(row.calls),
      mean_ms: round(row.ms / Number(row.calls), 3),
      mean_plan_ms: round(row.planMs / Number(row.calls), 3),
      total_ms: Math.round(row.ms),
      query: row.query.replace(/\s+/g, ' ').slice(0, 90),
    })),
  };
}

function runPgbench(url: string): number {
  const folder = mkdtempSync(path.join(tmpdir(), 'booking-pgbench-'));
  try {
    const script = path.join(folder, 'claim.sql');
    // The same rule the claims face: one row per (station, slot), refused quietly when taken.
    writeFileSync(
      script,
      [
        '\\set slot random(1, 96)',
        '\\set station random(1, 4)',
        'insert into pgbench_claims (station, slot, person) values (:station, :slot, :client_id)',
        '  on conflict do nothing;',
        '',
      ].join('\n'),
    );
    const parsed = new URL(url);
    const result = spawnSync(
      '/usr/lib/postgresql/15/bin/pgbench',
      [
        '-n',
        '-h',
        parsed.hostname,
        '-p',
        parsed.port,
        '-U',
        decodeURIComponent(parsed.username) || 'app',
        '-c',
        String(concurrency),
        '-j',
        '2',
        '-T',
        String(pgbenchSeconds),
        '-f',
        script,
        parsed.pathname.slice(1),
      ],
      { encoding: 'utf8' },
    );
    const tps = /tps = ([\d.]+) \(without initial connection time\)/.exec(result.stdout)?.[1];
    if (!tps) throw new Error(`pgbench failed: ${result.stderr || result.stdout}`);
    return Number(tps);
  } finally {
    rmSync(folder, { recursive: true, force: true });
  }
}

/**
 * The sitters' side runs in a worker thread, so the load generator does not share the app's
 * event loop (pgbench, likewise, is a process of its own).
 */
const claimLoop = `
const { parentPort, workerData } = require('node:worker_threads');
const { url, dayId, warmDayId, tokens, wanted, warmWanted, concurrency } = workerData;
const latencies = [];
const outcomes = {};
let next = 0;
// Untimed: one claim per request in flight, twice over, on another day (warmWanted holds its
// slots), so the server's pool has opened its connections and the claim's code is compiled, as
// in a process that has been serving for a while.
let warmed = 0;
async function warmUp() {
  while (warmed < 2 * concurrency) {
    const index = warmed++;
    const response = await fetch(url, {
      method: 'POST',
      headers: { 'Content-Type': 'application/json', Cookie: 'likeness_session=' + tokens[index] },
      body: JSON.stringify({ dayId: warmDayId, startsAt: warmWanted[index] }),
    });
    if (response.status !== 201) throw new Error('warm-up answered ' + response.status);
    await response.arrayBuffer();
  }
}
async function sitter() {
  while (next < tokens.length) {
    const index = next++;
    const begin = performance.now();
    const response = await fetch(url, {
      method: 'POST',
      headers: { 'Content-Type': 'application/json', Cookie: 'likeness_session=' + tokens[index] },
      body: JSON.stringify({ dayId, startsAt: wanted[index] }),
    });
    await response.arrayBuffer();
    latencies.push(performance.now() - begin);
    outcomes[response.status] = (outcomes[response.status] || 0) + 1;
  }
}
let started;
Promise.all(Array.from({ length: concurrency }, warmUp))
  .then(() => {
    started = performance.now();
    return Promise.all(Array.from({ length: concurrency }, sitter));
  })
  .then(() =>
    parentPort.postMessage({ latencies, outcomes, seconds: (performance.now() - started) / 1000 }),
  );
`;

function fireClaims(input: {
  url: string;
  dayId: string;
  warmDayId: string;
  warmWanted: string[];
  tokens: string[];
  wanted: string[];
  concurrency: number;
}): Promise<{ latencies: number[]; outcomes: Record<string, number>; seconds: number }> {
  return new Promise((resolve, reject) => {
    const worker = new Worker(claimLoop, { eval: true, workerData: input });
    worker.once('message', (result) => {
      resolve(result as { latencies: number[]; outcomes: Record<string, number>; seconds: number });
      void worker.terminate();
    });
    worker.once('error', reject);
  });
}

const benchmark: Benchmark = {
  name: 'booking-burst',
  async run({ adminUrl, print }) {
    const name = `booking_burst_${process.pid}`;
    const admin = new pg.Client({ connectionString: adminUrl });
    await admin.connect();
    await admin.query(`create database ${name}`);
    const url = adminUrl.replace(/\/[^/]*$/, `/${name}`);
    // The app's own database setup (its pool size, prepared statements); the bare handler
    // gets a plain pg pool of the same size, with an error listener: the throw-away cluster
    // ends idle connections when it stops, which is not a failure of the run.
    const db = createDatabase(url, { maxConnections: poolSize });
    const pool = new pg.Pool({ connectionString: url, max: poolSize });
    pool.on('error', () => undefined);
    let server: Server | undefined;
    try {
      await migrateToLatest(url);
      const { dayId, warmDayId, tokens } = await prepareDay(url);
      const config = toAppConfig(
        parseEnvironment({ NODE_ENV: 'production', PUBLIC_URL: 'http://127.0.0.1' }),
      );
      const { app } = createApp({
        db,
        config,
        mailer: discardingMailer,
        mailbox: null,
        clock: systemClock,
        logger: createLogger('silent'),
        // Booking touches no files; an unused scratch folder keeps the app's shape.
        storage: new LocalStorage(path.join(tmpdir(), 'likeness-bench-storage')),
        uploads: { ...config.uploads, folder: path.join(tmpdir(), 'likeness-bench-uploads') },
      });
      server = app.listen(0, '127.0.0.1');
      await new Promise((resolve) => server!.once('listening', resolve));
      const base = `http://127.0.0.1:${(server.address() as AddressInfo).port}`;
      const slots = generateSlots({ date, timeZone: 'Europe/London', breaks: [], ...hours });
      const random = repeatableRandom(2030);
      const wanted = tokens.map(() => slots[Math.floor(random() * slots.length)]!.startsAt);
      // The warm-up's claims: each its own slot of the next day (one station), all granted.
      const warmWanted = generateSlots({
        date: nextDate,
        timeZone: 'Europe/London',
        breaks: [],
        ...hours,
      })
        .slice(0, 2 * concurrency)
        .map((slot) => slot.startsAt);

      // The bare handler first, then the app, on the same sessions and the same slots.
      const burst = (claimsUrl: string) =>
        fireClaims({ url: claimsUrl, dayId, warmDayId, warmWanted, tokens, wanted, concurrency });
      const bare = await startBareHandler(pool);
      const bareRun = await burst(bare.url);
      await new Promise((resolve) => bare.server.close(resolve));

      await pool.query('create extension if not exists pg_stat_statements');
      await pool.query('select pg_stat_statements_reset()');
      const { latencies, outcomes, seconds } = await burst(`${base}/api/bookings`);

      const audit = new pg.Client({ connectionString: url });
      await audit.connect();
      const statements = await databaseTimeOfClaims(audit, seconds);
      const { rows } = await audit.query<{ oversold: string; doubled: string; booked: string }>(
        `select
           (select count(*) from (select starts_at from bookings where day_id = $1 and status = 'active'
              group by starts_at having count(*) > $2) over_capacity) as oversold,
           (select count(*) from (select station_id, starts_at from bookings where status = 'active'
              group by station_id, starts_at having count(*) > 1) shared) as doubled,
           (select count(*) from bookings where day_id = $1 and status = 'active') as booked`,
        [dayId, stations],
      );
      await audit.query(
        'create table pgbench_claims (station int not null, slot int not null, person int not null, unique (station, slot))',
      );
      await audit.end();
      const baselineTps = runPgbench(url);

      latencies.sort((a, b) => a - b);
      const claimsPerSecond = tokens.length / seconds;
      const bareClaimsPerSecond = tokens.length / bareRun.seconds;
      const bareLatencies = [...bareRun.latencies].sort((a, b) => a - b);
      print({
        bench: 'booking-burst',
        claims: tokens.length,
        concurrency,
        seats: slots.length * stations,
        booked: Number(rows[0]?.booked),
        refused: outcomes['409'] ?? 0,
        other_statuses: Object.fromEntries(
          Object.entries(outcomes).filter(([status]) => status !== '201' && status !== '409'),
        ),
        claims_per_s: round(claimsPerSecond),
        p50_ms: round(percentile(latencies, 50)),
        p95_ms: round(percentile(latencies, 95)),
        p99_ms: round(percentile(latencies, 99)),
        oversold: Number(rows[0]?.oversold) + Number(rows[0]?.doubled),
        bare_claims_per_s: round(bareClaimsPerSecond),
        bare_p99_ms: round(percentile(bareLatencies, 99)),
        ratio_bare: round(claimsPerSecond / bareClaimsPerSecond, 3),
        goal_ratio_bare: '>= 0.5',
        goal_p99_ms: '< 250',
        baseline: 'pgbench',
        baseline_tps: round(baselineTps),
        ratio_pgbench: round(claimsPerSecond / baselineTps, 3),
      });
      print({ bench: 'booking-burst-statements', ...statements });
    } finally {
      if (server) await new Promise((resolve) => server!.close(resolve));
      await db.destroy();
      await pool.end();
      await admin.query(`drop database if exists ${name} with (force)`);
      await admin.end();
    }
  },
};

export default benchmark;
