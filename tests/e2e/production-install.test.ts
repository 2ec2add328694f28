import { spawnSync } from 'node:child_process';
import { cpSync, existsSync, mkdirSync, mkdtempSync, rmSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { startMailCatcher, type MailCatcher } from '../../server/adapters/mail/mail-catcher';
import { createDatabase } from '../../server/db/database';
import { freePort } from '../../scripts/lib/postgres-cluster';
import { insertStaff, TEST_PASSWORD } from '../factories/accounts';
import { createEmptyDatabase } from '../setup/test-database';
import { startBuiltProcess, waitUntilReady, type BuiltProcess } from '../support/built-process';

// A production install: only the build, package.json and its lock, installed with
// `npm ci --omit=dev`. No sources, no tsx, no Vite, no mail catcher in node_modules.

const root = path.resolve(import.meta.dirname, '../..');
let scratch: string;
let database: { url: string; drop(): Promise<void> };
let catcher: MailCatcher;
let serving: BuiltProcess | undefined;

beforeAll(async () => {
  scratch = mkdtempSync(path.join(os.tmpdir(), 'likeness-production-'));
  for (const file of ['package.json', 'package-lock.json'])
    cpSync(path.join(root, file), path.join(scratch, file));
  mkdirSync(path.join(scratch, 'scripts'));
  cpSync(
    path.join(root, 'scripts', 'bootstrap.mjs'),
    path.join(scratch, 'scripts', 'bootstrap.mjs'),
  );
  cpSync(path.join(root, 'dist'), path.join(scratch, 'dist'), { recursive: true });
  database = await createEmptyDatabase();
  catcher = await startMailCatcher(0);
}, 60_000);

afterAll(async () => {
  serving?.kill();
  await catcher?.close();
  await database?.drop();
  rmSync(scratch, { recursive: true, force: true });
});

const npm = (args: string[], env: Record<string, string> = {}) =>
  spawnSync('npm', args, {
    cwd: scratch,
    encoding: 'utf8',
    env: { PATH: process.env.PATH ?? '', HOME: process.env.HOME ?? '/tmp', ...env },
  });

describe('a production install without development dependencies', () => {
  it('installs with npm ci --omit=dev and has none of the development tools', () => {
    const installed = npm(['ci', '--omit=dev', '--no-audit', '--no-fund', '--prefer-offline']);
    expect(installed.status, installed.stderr).toBe(0);
    for (const tool of ['tsx', 'vite', 'esbuild', 'smtp-server', 'mailparser', 'vitest'])
      expect(existsSync(path.join(scratch, 'node_modules', tool)), tool).toBe(false);
    expect(existsSync(path.join(scratch, 'node_modules', 'express'))).toBe(true);
  }, 300_000);

  it('migrates an empty database with npm run migrate, from the compiled migrations', () => {
    const first = npm(['run', '--silent', 'migrate'], { DATABASE_URL: database.url });
    expect(first.status, first.stdout + first.stderr).toBe(0);
    expect(first.stdout).toMatch(/Applied migrations: 2026-12-01T2300_create_accounts, /);
    const again = npm(['run', '--silent', 'migrate'], { DATABASE_URL: database.url });
    expect(again.stdout).toBe('Nothing to migrate.\n');
  }, 120_000);

  it('refuses to start without the settings production needs, naming each', () => {
    const refused = npm(['run', '--silent', 'serve'], {});
    expect(refused.status).toBe(2);
    expect(refused.stdout).toMatch(/DATABASE_URL/);
    expect(refused.stdout).toMatch(/SMTP_URL/);
    expect(refused.stdout).toMatch(/PUBLIC_URL/);
    expect(refused.stdout).toMatch(/URL_SIGNING_SECRET/);
  });

  // What `npm run serve` runs, started without npm in between so the signal reaches it as a
  // process manager's would.
  it('serves the app from the build: the page, its assets, sign-in, and a clean stop', async () => {
    const db = createDatabase(database.url);
    const admin = await insertStaff(db, { role: 'studio_admin' });
    await db.destroy();

    const port = await freePort();
    const baseUrl = `http://127.0.0.1:${port}`;
    serving = startBuiltProcess({
      cwd: scratch,
      command: process.execPath,
      args: ['scripts/bootstrap.mjs', 'serve'],
      env: {
        DATABASE_URL: database.url,
        SMTP_URL: catcher.smtpUrl,
        PUBLIC_URL: baseUrl,
        URL_SIGNING_SECRET: 'a-production-secret-of-at-least-32-chars',
        PORT: String(port),
        HOST: '127.0.0.1',
        LIKENESS_DATA_DIR: path.join(scratch, 'data'),
        LOG_LEVEL: 'warn',
      },
    });
    await serving.waitFor(/is serving/);
    await waitUntilReady(baseUrl);

    const page = await fetch(`${baseUrl}/`);
    expect(page.status).toBe(200);
    const html = await page.text();
    expect(html).toMatch(/<div id="root">/);
    const script = /src="(\/assets\/[^"]+\.js)"/.exec(html)?.[1];
    expect(script).toBeTruthy();
    expect((await fetch(`${baseUrl}${script}`)).status).toBe(200);

    const signIn = await fetch(`${baseUrl}/api/session`, {
      method: 'POST',
      headers: { 'content-type': 'application/json', origin: baseUrl },
      body: JSON.stringify({ email: admin.email, password: TEST_PASSWORD }),
    });
    expect(signIn.status).toBe(201);
    const cookie = signIn.headers.get('set-cookie')?.split(';')[0] ?? '';
    const session = await fetch(`${baseUrl}/api/session`, { headers: { cookie } });
    expect(session.status).toBe(200);
    expect(await session.json()).toMatchObject({
      user: { email: admin.email, role: 'studio_admin' },
    });

    expect(await serving.stop('SIGTERM')).toBe(0);
    expect(serving.output()).toMatch(/stopped cleanly/);
  }, 120_000);
});
