import { spawnSync } from 'node:child_process';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { sql } from 'kysely';
import pg from 'pg';
import { createDatabase } from '../server/db/database';
import { migrateToLatest } from '../server/db/migrator';
import type { Viewer } from '../server/lib/viewer';
import { createRosterService } from '../server/modules/roster/roster.service';
import type { Benchmark } from './run';

const rowCount = 20_000;

// Invented name parts; combined with a running number every person is unique.
const givenNames = ['Ines', 'Tom', 'Sanne', 'Priya', 'Maja', 'Oskar', 'Lena', 'Rui', 'Ada', 'Bo'];
const familyNames = ['Carvalho', 'Ashby', 'Vries', 'Nair', 'Berg', 'Lund', 'Moss', 'Pike', 'Reed'];
const departments = ['Structures', 'Design', 'Civil', 'Finance', 'People', 'Facilities'];
const offices = ['Leeds', 'Rotterdam', 'Porto'];

function staffRows(count: number): string[][] {
  return Array.from({ length: count }, (_, index) => {
    const given = givenNames[index % givenNames.length] ?? 'Ada';
    const family = `${familyNames[index % familyNames.length] ?? 'Pike'}-${index}`;
    return [
      given,
      family,
      `${given}.${family}@halvorsen-pike.example`.toLowerCase(),
      `HP-${String(index).padStart(6, '0')}`,
      departments[index % departments.length] ?? 'Design',
      `Engineer grade ${1 + (index % 5)}`,
      offices[index % offices.length] ?? 'Leeds',
    ];
  });
}

const header = ['First name', 'Last name', 'Work Email', 'Emp #', 'Dept.', 'Job title', 'Office'];
const toCsv = (rows: string[][]) => [header, ...rows].map((row) => row.join(',')).join('\r\n');

const timed = async <T>(work: () => Promise<T>): Promise<[T, number]> => {
  const start = performance.now();
  const result = await work();
  return [result, Math.round(performance.now() - start)];
};

const benchmark: Benchmark = {
  name: 'roster',
  async run({ adminUrl, print }) {
    const name = `roster_bench_${process.pid}`;
    const admin = new pg.Client({ connectionString: adminUrl });
    await admin.connect();
    await admin.query(`create database ${name}`);
    const url = adminUrl.replace(/\/[^/]*$/, `/${name}`);
    const folder = mkdtempSync(path.join(tmpdir(), 'roster-bench-'));
    const db = createDatabase(url);
    try {
      await migrateToLatest(url);
      const client = await db
        .insertInto('clients')
        .values({ name: 'Halvorsen & Pike Engineering', slug: 'halvorsen-pike' })
        .returning('id')
        .executeTakeFirstOrThrow();
      const user = await db
        .insertInto('users')
        .values({ email: 'owner@northlight.example', displayName: 'Bench', role: 'studio_admin' })
        .returning('id')
        .executeTakeFirstOrThrow();
      const viewer: Viewer = {
        kind: 'staff',
        id: user.id,
        role: 'studio_admin',
        email: 'owner@northlight.example',
        displayName: 'Bench',
        clientId: null,
        sessionId: 'bench',
        sessionExpiresAt: new Date(Date.now() + 3_600_000),
      };
      const roster = createRosterService({ db });
      const rows = staffRows(rowCount);
      const bytes = new TextEncoder().encode(toCsv(rows));
      const zones = {
        Leeds: 'Europe/London',
        Rotterdam: 'Europe/Amsterdam',
        Porto: 'Europe/Lisbon',
      };

      // Parse + validate + diff + store the preview: what the upload request does.
      const [draft, previewMs] = await timed(() =>
        roster.upload(viewer, client.id, 'bench.csv', bytes),
      );
      if (draft.counts.add !== rowCount)
        throw new Error(`preview found ${draft.counts.add} to add`);
      print({ bench: 'roster-preview', rows: rowCount, ms: previewMs, goal_ms: 2000 });

      // Baseline: psql \copy of the same rows into a plain table with the same columns.
      await sql`create table people_copy (client_id uuid, given_name text, family_name text,
        email text, employee_id text, department text, job_title text, office text)`.execute(db);
      const copyFile = path.join(folder, 'rows.csv');
      writeFileSync(copyFile, rows.map((row) => [client.id, ...row].join(',')).join('\n'));
      const copyStart = performance.now();
      const copy = spawnSync('/usr/bin/psql', [
        url,
        '-q',
        '-c',
        `\\copy people_copy from '${copyFile}' with (format csv)`,
      ]);
      const baselineMs = Math.round(performance.now() - copyStart);
      if (copy.status !== 0) throw new Error(`psql failed: ${copy.stderr.toString()}`);

      const [, commitMs] = await timed(() =>
        roster.commit(viewer, client.id, draft.id, { officeTimeZones: zones }),
      );
      print({
        bench: 'roster-commit',
        rows: rowCount,
        ms: commitMs,
        baseline: 'psql copy',
        baseline_ms: baselineMs,
        ratio: Number((commitMs / baselineMs).toFixed(2)),
        goal_ratio: 3,
      });

      // A re-import of the same staff with every tenth person changed: match and diff cost.
      const changed = rows.map((row, index) =>
        index % 10 === 0 ? [...row.slice(0, 5), 'Senior engineer', ...row.slice(6)] : row,
      );
      const [again, reimportPreviewMs] = await timed(() =>
        roster.upload(viewer, client.id, 'bench-2.csv', new TextEncoder().encode(toCsv(changed))),
      );
      const [, reimportCommitMs] = await timed(() =>
        roster.commit(viewer, client.id, again.id, { officeTimeZones: {} }),
      );
      print({
        bench: 'roster-reimport',
        rows: rowCount,
        updated: again.counts.update,
        preview_ms: reimportPreviewMs,
        commit_ms: reimportCommitMs,
      });
    } finally {
      await db.destroy();
      rmSync(folder, { recursive: true, force: true });
      await admin.query(`drop database if exists ${name}`);
      await admin.end();
    }
  },
};

export default benchmark;
