import type { Server } from 'node:http';
import express, { type Express } from 'express';
import { systemClock } from '../adapters/clock';
import type { Mailbox } from '../adapters/mail/mail-catcher';
import type { Mailer } from '../adapters/mail/mailer';
import { createPgNotifications } from '../adapters/notifications';
import type { ObjectStorage } from '../adapters/storage/storage';
import { createApp, type AppDeps } from '../app';
import type { AppConfig, RawConfig } from '../config';
import type { Db } from '../db/database';
import { startDayJobsWorker } from '../jobs/day-jobs';
import type { Logger } from '../lib/logger';
import { RouteTable } from '../lib/route-table';
import { createDeliveryService } from '../modules/delivery/delivery.service';
import { frameTasks } from '../modules/frames/frame-tasks';
import { createCrossProcessUploadLocker } from '../modules/frames/upload-locker';
import { registerHealthRoutes } from '../modules/health/health.routes';
import { portraitTasks } from '../modules/looks/portrait-tasks';
import { matchingTasks } from '../modules/matching/matching-tasks';
import { drainHttpServer } from './http-drain';
import { createLifecycle } from './lifecycle';
import type { Cleanup } from './shutdown';

export interface RoleDeps {
  raw: RawConfig;
  config: AppConfig;
  databaseUrl: string;
  db: Db;
  mailer: Mailer;
  mailbox: Mailbox | null;
  storage: ObjectStorage;
  logger: Logger;
  /** How the browser app is served; asked for only by a process that serves HTTP. */
  frontend: () => Promise<AppDeps['frontend']>;
  /** Binds the app (plain HTTP here; npm start passes its local-HTTPS listener). */
  listen?: (app: Express) => Promise<Server>;
  addCleanup: (cleanup: Cleanup) => void;
  say: (line: string) => void;
}

function listenPlain(app: Express, port: number, host: string): Promise<Server> {
  return new Promise((resolve, reject) => {
    const server = app.listen(port, host, () => resolve(server));
    server.once('error', reject);
  });
}

/**
 * Starts what PROCESS_ROLE asks for: `web` (HTTP and console events), `worker`
 * (graphile-worker's jobs) or `all` (both, as npm start does). Everything the processes share
 * lives in PostgreSQL or the storage, so any number of each may serve one studio.
 */
export async function startRoles(deps: RoleDeps): Promise<void> {
  const { raw, config, databaseUrl, db, storage, logger, addCleanup } = deps;
  const role = raw.PROCESS_ROLE;
  const lifecycle = createLifecycle();
  const drainMs = raw.DRAIN_SECONDS * 1000;

  if (role !== 'web') {
    const portraits = portraitTasks({ db, storage, logger, studioName: config.studioName });
    // Invitations, reminders, day-before mail, reading frames and rendering portraits.
    const worker = await startDayJobsWorker(
      { db, databaseUrl, clock: systemClock, mailer: deps.mailer, config, logger },
      {
        ...frameTasks({ db, storage, maxPixels: config.uploads.maxPixels, logger }),
        ...matchingTasks({ db, logger }),
        ...portraits.handlers,
        ...createDeliveryService({ db, clock: systemClock, storage }).handlers(),
      },
      { preparedStatements: raw.DATABASE_PREPARED_STATEMENTS },
    );
    addCleanup(() => portraits.close());
    // graphile-worker's stop lets running jobs finish before it resolves.
    addCleanup(() => worker.stop());
  }

  if (role === 'worker') {
    if (raw.HEALTH_PORT !== undefined) {
      const server = await listenPlain(workerHealthApp(deps, lifecycle), raw.HEALTH_PORT, raw.HOST);
      addCleanup(() => drainHttpServer(server, lifecycle, drainMs).then(() => undefined));
      deps.say(`Health and readiness at http://${raw.HOST}:${raw.HEALTH_PORT}/api/ready`);
    }
    return;
  }

  // One dedicated connection LISTENs for station console changes from every app process.
  const notifications = await createPgNotifications(databaseUrl, (error) =>
    logger.warn({ err: error }, 'console notifications connection failed; reconnecting'),
  );
  addCleanup(() => notifications.close());
  const uploadLocker = createCrossProcessUploadLocker(databaseUrl);
  addCleanup(() => uploadLocker.close());
  const { app } = createApp({
    db,
    config,
    mailer: deps.mailer,
    mailbox: deps.mailbox,
    clock: systemClock,
    logger,
    frontend: await deps.frontend(),
    notifications,
    storage,
    uploads: config.uploads,
    uploadLocker,
    lifecycle,
    runsJobs: role === 'all',
  });
  const server = deps.listen ? await deps.listen(app) : await listenPlain(app, raw.PORT, raw.HOST);
  addCleanup(async () => {
    const outcome = await drainHttpServer(server, lifecycle, drainMs);
    if (outcome === 'timed out') {
      deps.say(`Requests still open after ${raw.DRAIN_SECONDS} s were cut off.`);
    }
  });
}

/** A worker has no app; a small server answers health checks when HEALTH_PORT is set. */
function workerHealthApp(deps: RoleDeps, lifecycle: ReturnType<typeof createLifecycle>): Express {
  const app = express();
  app.disable('x-powered-by');
  const router = express.Router();
  registerHealthRoutes(new RouteTable(router), {
    db: deps.db,
    mail: deps.mailbox ? 'local catcher' : 'smtp',
    notifications: undefined,
    storage: deps.storage,
    runsJobs: true,
    lifecycle,
  });
  app.use('/api', router);
  return app;
}
