// The app as its own process, for tests that kill it with SIGKILL mid-request.
// Usage: serve-app.ts DATABASE_URL SCRATCH_FOLDER; prints "port N" once listening.
import path from 'node:path';
import { systemClock } from '../../server/adapters/clock';
import { createSmtpMailer } from '../../server/adapters/mail/mailer';
import { LocalStorage } from '../../server/adapters/storage/local-storage';
import { createApp } from '../../server/app';
import { parseEnvironment, toAppConfig } from '../../server/config';
import { createDatabase } from '../../server/db/database';
import { createLogger } from '../../server/lib/logger';

const [databaseUrl, scratch] = process.argv.slice(2);
const config = toAppConfig(
  parseEnvironment({ NODE_ENV: 'test', PUBLIC_URL: 'http://likeness.test' }),
);
const { app } = createApp({
  db: createDatabase(databaseUrl!),
  config,
  // No mail is sent by the requests these tests make; nothing listens on this port.
  mailer: createSmtpMailer({ smtpUrl: 'smtp://127.0.0.1:9', from: config.mailFrom }),
  mailbox: null,
  clock: systemClock,
  logger: createLogger('silent'),
  storage: new LocalStorage(path.join(scratch!, 'storage')),
  uploads: { folder: path.join(scratch!, 'uploads'), maxBytes: 10_000_000, maxPixels: 10_000_000 },
});
const server = app.listen(0, '127.0.0.1', () => {
  const address = server.address();
  process.stdout.write(`port ${typeof address === 'object' && address ? address.port : 0}\n`);
});
