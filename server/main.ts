// The production entry: `npm run serve`, built to dist/server/main.js by `npm run build`.
// It needs only the production dependencies: no tsx, Vite, embedded PostgreSQL, demo data or
// mail catcher. Everything comes from the environment (README, "Running in production").
import { existsSync } from 'node:fs';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { createSmtpMailer } from './adapters/mail/mailer';
import { createStorage } from './adapters/storage/create-storage';
import { mailIdentity, parseEnvironment, toAppConfig, type RawConfig } from './config';
import { createDatabase } from './db/database';
import { migrateToLatest, migrationFolderFor } from './db/migrator';
import { createLogger } from './lib/logger';
import { startRoles } from './runtime/run-roles';
import { createShutdown } from './runtime/shutdown';

const here = path.dirname(fileURLToPath(import.meta.url));
const say = (line: string) => process.stdout.write(`[likeness] ${line}\n`);

/** What a production process cannot guess; each missing one is named at once. */
function missingSettings(raw: RawConfig): string[] {
  const missing: string[] = [];
  if (!raw.DATABASE_URL) missing.push('DATABASE_URL (the PostgreSQL to use)');
  if (!raw.SMTP_URL) missing.push('SMTP_URL (the mail server invitations go through)');
  if (raw.PROCESS_ROLE !== 'worker') {
    if (!raw.PUBLIC_URL) missing.push('PUBLIC_URL (the address people open, used in links)');
    // Each process would otherwise sign proof URLs with a secret of its own.
    if (!raw.URL_SIGNING_SECRET)
      missing.push('URL_SIGNING_SECRET (32 characters or more, the same for every process)');
  }
  return missing;
}

async function main() {
  const raw = parseEnvironment({ NODE_ENV: 'production', ...process.env });
  const missing = missingSettings(raw);
  if (missing.length > 0) {
    say('Cannot start: set these in the environment:');
    for (const line of missing) say(`  ${line}`);
    process.exit(2);
  }
  const databaseUrl = raw.DATABASE_URL!;
  const config = toAppConfig(raw);
  const logger = createLogger(raw.LOG_LEVEL);
  const shutdown = createShutdown(say, logger);

  const browserApp = path.resolve(here, '..');
  if (raw.PROCESS_ROLE !== 'worker' && !existsSync(path.join(browserApp, 'index.html'))) {
    say(`The browser app is missing from ${browserApp}: run \`npm run build\` first.`);
    process.exit(2);
  }

  if (raw.MIGRATE_ON_START) {
    const applied = await migrateToLatest(databaseUrl, migrationFolderFor(import.meta.url));
    if (applied.length > 0) say(`Applied migrations: ${applied.join(', ')}`);
  }
  const db = createDatabase(databaseUrl, {
    prepareStatements: raw.DATABASE_PREPARED_STATEMENTS,
  });
  shutdown.add(() => db.destroy());
  const mailer = createSmtpMailer({ smtpUrl: raw.SMTP_URL!, ...mailIdentity(config) });
  shutdown.add(() => mailer.close());
  const storage = createStorage(config.storage);
  shutdown.add(() => storage.close());

  try {
    await startRoles({
      raw,
      config,
      databaseUrl,
      db,
      mailer,
      mailbox: null,
      storage,
      logger,
      frontend: async () => ({ kind: 'static', folder: browserApp }),
      addCleanup: shutdown.add,
      say,
    });
  } catch (error) {
    say(error instanceof Error ? error.message : String(error));
    await shutdown.shutDown('error', 1);
    return;
  }
  say(
    raw.PROCESS_ROLE === 'worker'
      ? 'Running as a worker: background jobs only.'
      : `Likeness (${raw.PROCESS_ROLE}) is serving ${config.publicUrl} on ${raw.HOST}:${raw.PORT}.`,
  );
}

main().catch((error: unknown) => {
  say(error instanceof Error ? error.message : String(error));
  process.exit(1);
});
