import { createHash } from 'node:crypto';
import type { Express } from 'express';
import type { Server } from 'node:http';
import os from 'node:os';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import type { MailCatcher } from '../server/adapters/mail/mail-catcher';
import { createSmtpMailer } from '../server/adapters/mail/mailer';
import { createCaughtMailStore } from '../server/modules/dev-mailbox/dev-mailbox.repository';
import { createStorage } from '../server/adapters/storage/create-storage';
import { mailIdentity, parseEnvironment, toAppConfig } from '../server/config';
import { createDatabase } from '../server/db/database';
import { migrateToLatest } from '../server/db/migrator';
import { createLogger } from '../server/lib/logger';
import type { AppDeps } from '../server/app';
import { startRoles } from '../server/runtime/run-roles';
import { createShutdown } from '../server/runtime/shutdown';
import {
  DEMO_PASSWORD,
  demoCoordinators,
  demoStaff,
  firstDemoSitterEmail,
  loadDemoScenario,
} from './lib/demo-scenario';
import { loadDemoPhotographedDay } from './lib/demo-photographed-day';
import { browserBuildIsCurrent, serverBuildIsCurrent } from './lib/build-freshness';
import {
  createLocalHttpsServer,
  ensureLocalCertificate,
  lanAddresses,
  servesLocalHttps,
  trustInstructions,
  type LocalCertificate,
} from './lib/local-certificate';
import {
  chooseDataFolder,
  ensureDatabase,
  startCluster,
  type RunningCluster,
} from './lib/postgres-cluster';

const root = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '..');
const mode = process.env.LIKENESS_MODE === 'dev' ? 'dev' : 'start';
const say = (line: string) => process.stdout.write(`[likeness] ${line}\n`);

const raw = parseEnvironment({
  NODE_ENV: mode === 'dev' ? 'development' : 'production',
  ...process.env,
});
const config = toAppConfig(raw);
const logger = createLogger(raw.LOG_LEVEL);

const shutdown = createShutdown(say, logger);

async function openDatabase(): Promise<string> {
  if (raw.DATABASE_URL) {
    say('Using the PostgreSQL server given in DATABASE_URL.');
    return raw.DATABASE_URL;
  }
  const projectKey = createHash('sha256').update(root).digest('hex').slice(0, 12);
  const dataFolder = chooseDataFolder(
    path.resolve(root, raw.LIKENESS_DATA_DIR, 'postgres'),
    `/var/lib/likeness/${projectKey}/postgres`,
  );
  const cluster: RunningCluster = await startCluster({ dataFolder, port: raw.PG_PORT, log: say });
  if (cluster.startedHere) {
    shutdown.add(() => {
      cluster.stop();
      say(`Stopped PostgreSQL on ${cluster.dataFolder}.`);
    });
  } else {
    // Said plainly at exit too: "stopped cleanly" must not suggest the database stopped.
    const owner = cluster.ownedBy;
    shutdown.add(() => {
      say(`PostgreSQL keeps running: it belongs to the Likeness process with pid ${owner}.`);
    });
  }
  say(`PostgreSQL data lives in ${cluster.dataFolder} (127.0.0.1:${cluster.port}).`);
  return ensureDatabase(cluster, 'likeness');
}

// Vite is a development dependency: it is imported only when there is something to build.
async function frontend(): Promise<AppDeps['frontend']> {
  if (mode === 'dev') {
    const vite = await import('vite');
    const server = await vite.createServer({
      root,
      server: { middlewareMode: true },
      appType: 'spa',
    });
    shutdown.add(() => server.close());
    return { kind: 'middleware', handler: server.middlewares };
  }
  // The browser build empties dist/, so the server is compiled again after it.
  const browserCurrent = browserBuildIsCurrent(root);
  if (browserCurrent) {
    say('The browser app in dist/ is up to date: serving it without building.');
  } else {
    say('Building the browser app...');
    const vite = await import('vite');
    await vite.build({ root, logLevel: 'warn' });
  }
  if (!browserCurrent || !serverBuildIsCurrent(root)) {
    const { buildServer } = await import('./build-server.mjs');
    await buildServer(root);
  }
  return { kind: 'static', folder: path.join(root, 'dist') };
}

async function main() {
  const databaseUrl = await openDatabase();
  const applied = await migrateToLatest(databaseUrl);
  if (applied.length > 0) say(`Applied migrations: ${applied.join(', ')}`);

  // On the studio network tablets need a secure page for the camera and the offline console.
  let certificate: LocalCertificate | null = null;
  if (servesLocalHttps(raw.HOST, raw.TRUST_PROXY)) {
    const addresses = lanAddresses();
    certificate = await ensureLocalCertificate(path.resolve(root, raw.LIKENESS_DATA_DIR, 'tls'), {
      names: [os.hostname()],
      ips: raw.HOST === '0.0.0.0' || raw.HOST === '::' ? addresses : [raw.HOST],
    });
    if (certificate.created) say(`Made a local HTTPS certificate in ${certificate.certPath}.`);
    if (!raw.PUBLIC_URL) {
      const host = raw.HOST === '0.0.0.0' || raw.HOST === '::' ? addresses[0] : raw.HOST;
      config.publicUrl = `https://${host ?? 'localhost'}:${raw.PORT}`;
    }
  }

  const db = createDatabase(databaseUrl, {
    prepareStatements: raw.DATABASE_PREPARED_STATEMENTS,
  });
  shutdown.add(() => db.destroy());

  const demoLoaded = raw.LOAD_DEMO && (await loadDemoScenario(db));
  if (demoLoaded) {
    say('Loaded the demo scenario (Halvorsen & Pike Engineering, 240 people in three offices).');
  }

  let catcher: MailCatcher | null = null;
  let smtpUrl = raw.SMTP_URL;
  if (!smtpUrl) {
    // The catcher's SMTP server and parser are development dependencies: loaded only here.
    const { startMailCatcher } = await import('../server/adapters/mail/mail-catcher');
    // Caught mail is kept in the database, so the Mailbox survives a restart.
    catcher = await startMailCatcher(raw.MAIL_CATCHER_PORT, { store: createCaughtMailStore(db) });
    const started = catcher;
    shutdown.add(() => started.close());
    smtpUrl = catcher.smtpUrl;
    say(
      `Local mail catcher listening on ${catcher.smtpUrl}: read it at ${config.publicUrl}/studio/mailbox`,
    );
  }
  const mailer = createSmtpMailer({ smtpUrl, ...mailIdentity(config) });
  shutdown.add(() => mailer.close());

  const storage = createStorage(config.storage);
  shutdown.add(() => storage.close());
  say(
    config.storage.kind === 'local'
      ? `Frames are stored in ${config.storage.root}.`
      : `Frames are stored in the S3 bucket ${config.storage.bucket}.`,
  );
  if (demoLoaded) {
    const photographed = await loadDemoPhotographedDay({
      db,
      storage,
      limits: config.uploads,
      now: new Date(),
    });
    if (photographed)
      say(
        `Added yesterday's photographed day for Aldermoor Housing Trust (${photographed.frames} frames, read and matched in the background).`,
      );
  }

  await startRoles({
    raw,
    config,
    databaseUrl,
    db,
    mailer,
    mailbox: catcher,
    storage,
    logger,
    frontend,
    addCleanup: shutdown.add,
    say,
    // On the studio network tablets need a secure page for the camera and the offline console.
    ...(certificate ? { listen: listenSecure(certificate) } : {}),
  });
  if (raw.PROCESS_ROLE === 'worker') {
    say('Running as a worker: background jobs only, no web server in this process.');
    say('Press Ctrl-C to stop.');
    return;
  }
  if (raw.PROCESS_ROLE === 'web') say('Running as a web process: jobs run in worker processes.');

  say('');
  say(
    `Likeness is running at ${config.publicUrl}  (${mode === 'dev' ? 'development, hot reload' : 'built app'})`,
  );
  if (raw.LOAD_DEMO) {
    say(`Demo sign-ins (password "${DEMO_PASSWORD}" for every staff account):`);
    for (const member of demoStaff) say(`  ${member.role.padEnd(13)} ${member.email}`);
    for (const coordinator of demoCoordinators)
      say(`  coordinator   ${coordinator.email}  (${coordinator.client})`);
    say(
      `  sitter        ${firstDemoSitterEmail()}  (no password: ask for a link on the sign-in page,`,
    );
    say("                then open it from the studio admin's mailbox)");
  }
  if (certificate) {
    say('');
    for (const line of trustInstructions(config.publicUrl, certificate)) say(line);
  }
  say('Press Ctrl-C to stop.');
}

function listenSecure(certificate: LocalCertificate) {
  return (app: Express) =>
    new Promise<Server>((resolve, reject) => {
      const listening = createLocalHttpsServer(app, certificate).listen(raw.PORT, raw.HOST, () =>
        resolve(listening),
      );
      listening.once('error', reject);
    });
}

main().catch((error: unknown) => {
  say(error instanceof Error ? error.message : String(error));
  void shutdown.shutDown('error', 1);
});
