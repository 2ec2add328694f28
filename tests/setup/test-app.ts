import type { Clock } from '../../server/adapters/clock';
import { startMailCatcher, type MailCatcher } from '../../server/adapters/mail/mail-catcher';
import { createSmtpMailer } from '../../server/adapters/mail/mailer';
import { createPgNotifications } from '../../server/adapters/notifications';
import { createApp, type AppDeps } from '../../server/app';
import { parseEnvironment, toAppConfig, type AppConfig } from '../../server/config';
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
  close(): Promise<void>;
}

export async function startTestApp(
  options: { env?: Record<string, string>; frontend?: AppDeps['frontend'] } = {},
): Promise<TestApp> {
  const database = await createTestDatabase();
  const mail = await startMailCatcher(0);
  const config = toAppConfig(
    parseEnvironment({ NODE_ENV: 'test', PUBLIC_URL: 'http://likeness.test', ...options.env }),
  );
  const mailer = createSmtpMailer({ smtpUrl: mail.smtpUrl, from: config.mailFrom });
  const clock = new ManualClock();
  const notifications = await createPgNotifications(database.url);
  const { app, routeTable } = createApp({
    db: database.db,
    config,
    mailer,
    mailbox: mail,
    clock,
    logger: createLogger('silent'),
    frontend: options.frontend,
    notifications,
  });
  return {
    app,
    routeTable,
    database,
    db: database.db,
    mail,
    clock,
    config,
    async close() {
      mailer.close();
      await notifications.close();
      await mail.close();
      await database.drop();
    },
  };
}
