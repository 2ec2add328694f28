import { mkdtempSync, rmSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import type { Clock } from '../../server/adapters/clock';
import { startMailCatcher, type MailCatcher } from '../../server/adapters/mail/mail-catcher';
import { createSmtpMailer } from '../../server/adapters/mail/mailer';
import {
  createPgNotifications,
  type Notifications,
  type ReconnectOptions,
} from '../../server/adapters/notifications';
import { LocalStorage } from '../../server/adapters/storage/local-storage';
import type { ObjectStorage } from '../../server/adapters/storage/storage';
import { createApp, type AppDeps } from '../../server/app';
import { mailIdentity, parseEnvironment, toAppConfig, type AppConfig } from '../../server/config';
import { createLogger } from '../../server/lib/logger';
import { createTestDatabase, type TestDatabase } from './test-database';

/** A clock the test moves by hand. */
export class ManualClock implements Clock {
  private current: number;
  constructor(start = Date.now()) {
    this.current = start;
  }
  now() {
    return new Date(this.current);
  }
  advance(ms: number) {
    this.current += ms;
  }
}

export interface TestApp {
  app: ReturnType<typeof createApp>['app'];
  routeTable: ReturnType<typeof createApp>['routeTable'];
  database: TestDatabase;
  db: TestDatabase['db'];
  mail: MailCatcher;
  clock: ManualClock;
  config: AppConfig;
  storage: ObjectStorage;
  /** Where tus keeps files still arriving. */
  uploadFolder: string;
  notifications: Notifications;
  close(): Promise<void>;
}

export async function startTestApp(
  options: {
    env?: Record<string, string>;
    frontend?: AppDeps['frontend'];
    storage?: ObjectStorage;
    uploads?: Partial<AppDeps['uploads']>;
    /** A database of the test's own (a private cluster it can stop) instead of a clone. */
    database?: TestDatabase;
    reconnect?: ReconnectOptions;
  } = {},
): Promise<TestApp> {
  const database = options.database ?? (await createTestDatabase());
  const mail = await startMailCatcher(0);
  const config = toAppConfig(
    parseEnvironment({ NODE_ENV: 'test', PUBLIC_URL: 'http://likeness.test', ...options.env }),
  );
  const mailer = createSmtpMailer({ smtpUrl: mail.smtpUrl, ...mailIdentity(config) });
  const clock = new ManualClock();
  const notifications = await createPgNotifications(
    database.url,
    () => undefined,
    options.reconnect,
  );
  const scratch = mkdtempSync(path.join(os.tmpdir(), 'likeness-test-files-'));
  const storage = options.storage ?? new LocalStorage(path.join(scratch, 'storage'));
  const uploadFolder = path.join(scratch, 'uploads');
  const { app, routeTable } = createApp({
    db: database.db,
    config,
    mailer,
    mailbox: mail,
    clock,
    logger: createLogger('silent'),
    frontend: options.frontend,
    notifications,
    storage,
    uploads: {
      folder: uploadFolder,
      maxBytes: 200_000_000,
      maxPixels: 100_000_000,
      ...options.uploads,
    },
  });
  return {
    app,
    routeTable,
    database,
    db: database.db,
    mail,
    clock,
    config,
    storage,
    uploadFolder,
    notifications,
    async close() {
      mailer.close();
      await notifications.close();
      await mail.close();
      await database.drop();
      rmSync(scratch, { recursive: true, force: true });
    },
  };
}
