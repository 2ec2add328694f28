import { randomUUID } from 'node:crypto';
import path from 'node:path';
import cookieParser from 'cookie-parser';
import express, { type RequestHandler } from 'express';
import helmet from 'helmet';
import type { Clock } from './adapters/clock';
import type { Mailbox } from './adapters/mail/mail-catcher';
import type { Mailer } from './adapters/mail/mailer';
import type { Notifications } from './adapters/notifications';
import type { ObjectStorage } from './adapters/storage/storage';
import type { Locker } from '@tus/server';
import type { AppConfig } from './config';
import type { Db } from './db/database';
import { refuseControlCharacters } from './lib/control-characters';
import { refuseCrossSiteChanges } from './lib/cross-site';
import { AppError } from './lib/errors';
import { errorHandler, notFoundHandler } from './lib/error-handler';
import type { Logger } from './lib/logger';
import { RouteTable } from './lib/route-table';
import type { Lifecycle } from './runtime/lifecycle';
import { loadViewer } from './lib/session-cookie';
import { registerAuthRoutes } from './modules/auth/auth.routes';
import { registerBookingRoutes } from './modules/booking/booking.routes';
import { createBookingService } from './modules/booking/booking.service';
import { createAuthService } from './modules/auth/auth.service';
import { registerClientsRoutes } from './modules/clients/clients.routes';
import { registerConsoleRoutes } from './modules/console/console.routes';
import { createConsoleService } from './modules/console/console.service';
import { createClientsService } from './modules/clients/clients.service';
import { registerDaysRoutes } from './modules/days/days.routes';
import { mountFrameUploads } from './modules/frames/frame-upload-handler';
import { registerFramesRoutes } from './modules/frames/frames.routes';
import { createFramesService } from './modules/frames/frames.service';
import { registerInvoicesRoutes } from './modules/invoices/invoices.routes';
import { createInvoicesService } from './modules/invoices/invoices.service';
import { registerMatchingRoutes } from './modules/matching/matching.routes';
import { createProofUrls } from './modules/proofs/proof-urls';
import { registerProofsRoutes } from './modules/proofs/proofs.routes';
import { proofsServiceFor } from './modules/proofs/proofs-wiring';
import { createSitterProofsService } from './modules/proofs/sitter-proofs.service';
import { registerDeliveryRoutes } from './modules/delivery/delivery.routes';
import { createDeliveryService } from './modules/delivery/delivery.service';
import { registerLooksRoutes } from './modules/looks/looks.routes';
import { createLooksService } from './modules/looks/looks.service';
import { createPortraitsService } from './modules/looks/portraits.service';
import { registerRetouchRoutes } from './modules/retouch/retouch.routes';
import { createRetouchService } from './modules/retouch/retouch.service';
import { createMatchingService } from './modules/matching/matching.service';
import { registerDayChangesRoutes } from './modules/days/day-changes.routes';
import { createDayChangesService } from './modules/days/day-changes.service';
import { createInvitationsService } from './modules/invitations/invitations.service';
import { registerProgressRoutes } from './modules/progress/progress.routes';
import { createProgressService } from './modules/progress/progress.service';
import { createDaysService } from './modules/days/days.service';
import { registerDevMailboxRoutes } from './modules/dev-mailbox/dev-mailbox.routes';
import { registerHealthRoutes } from './modules/health/health.routes';
import { registerPeopleRoutes } from './modules/people/people.routes';
import { createPeopleService } from './modules/people/people.service';
import { registerRosterRoutes } from './modules/roster/roster.routes';
import { createRosterService } from './modules/roster/roster.service';
import { registerSetupCardsRoutes } from './modules/setup-cards/setup-cards.routes';
import { createSetupCardsService } from './modules/setup-cards/setup-cards.service';
import { registerSittersRoutes } from './modules/sitters/sitters.routes';
import { registerUsersRoutes } from './modules/users/users.routes';
import { createUsersService } from './modules/users/users.service';

export interface AppDeps {
  db: Db;
  config: AppConfig;
  mailer: Mailer;
  /** The local catcher's inbox in development and tests; null with a real SMTP server. */
  mailbox: Mailbox | null;
  clock: Clock;
  logger: Logger;
  /** How the browser app is served: built files, Vite's dev middleware, or not at all. */
  frontend?: { kind: 'static'; folder: string } | { kind: 'middleware'; handler: RequestHandler };
  /** LISTEN/NOTIFY for the live station console; without it tablets fall back to polling. */
  notifications?: Notifications;
  /** Originals, previews and thumbnails: local disk or S3-compatible storage. */
  storage: ObjectStorage;
  /** Where tus keeps files still arriving, and the limits every upload is held to. */
  uploads: { folder: string; maxBytes: number; maxPixels: number };
  /** Locks an upload while a request writes to it; across processes in production. */
  uploadLocker?: Locker;
  /** Stopping: readiness turns 503, event streams end, kept-alive connections are closed. */
  lifecycle?: Lifecycle;
  /** This process also runs the job queue (PROCESS_ROLE=all): readiness checks it too. */
  runsJobs?: boolean;
}

/**
 * Mutations must be JSON (or raw bytes, for file uploads): a cross-site form can send neither
 * without a preflight.
 */
const requireJsonForMutations: RequestHandler = (req, _res, next) => {
  const mutating = !['GET', 'HEAD', 'OPTIONS'].includes(req.method);
  const hasBody = Number(req.get('content-length') ?? 0) > 0 || req.get('transfer-encoding');
  if (mutating && hasBody && !req.is(['application/json', 'application/octet-stream'])) {
    next(new AppError('unsupported_media_type', 415, 'Send the request as JSON.'));
    return;
  }
  next();
};

export function createApp(deps: AppDeps) {
  const { db, config, mailer, mailbox, clock, logger } = deps;
  const app = express();
  // One reverse proxy in front, the listed proxy addresses, or none: only their
  // X-Forwarded-* headers are believed (README: set it only when the proxy is the sole way in).
  app.set(
    'trust proxy',
    Array.isArray(config.trustProxy) ? config.trustProxy : config.trustProxy ? 1 : false,
  );
  app.disable('x-powered-by');

  app.use((req, res, next) => {
    // A stopping process asks each client to open its next request elsewhere.
    if (deps.lifecycle?.draining) res.setHeader('Connection', 'close');
    req.requestId = randomUUID();
    res.setHeader('X-Request-Id', req.requestId);
    next();
  });
  app.use(
    helmet({
      contentSecurityPolicy:
        deps.frontend?.kind === 'middleware'
          ? false
          : {
              directives: {
                // The pass scanner's QR decoder is WebAssembly, bundled with the app.
                'script-src': ["'self'", "'wasm-unsafe-eval'"],
                'img-src': ["'self'", 'data:', 'blob:'],
                'media-src': ["'self'", 'blob:'],
                'upgrade-insecure-requests': null,
              },
            },
      // Sent below, and only over HTTPS: on plain HTTP (the venue's local network) a browser
      // ignores it anyway, and saying it there would promise what the request did not have.
      strictTransportSecurity: false,
    }),
  );
  app.use((req, res, next) => {
    // No includeSubDomains: the studio's other hosts are not ours to pin to HTTPS.
    if (req.secure) res.setHeader('Strict-Transport-Security', 'max-age=31536000');
    next();
  });

  const auth = createAuthService({ db, clock, mailer, config, logger });
  const users = createUsersService({ db, auth });
  const clients = createClientsService({ db });
  const roster = createRosterService({ db });
  const people = createPeopleService({ db });
  const days = createDaysService({ db });
  const booking = createBookingService({ db, clock, mailer, config, logger });
  const invitations = createInvitationsService({
    db,
    clock,
    mailer,
    days,
    booking,
    issueSitterInvitationLink: (personId) => auth.issueSitterInvitationLink(personId),
    reminderCooldownMs: config.reminderCooldownMs,
  });
  const progress = createProgressService({ db, days });
  const retouch = createRetouchService({
    db,
    storage: deps.storage,
    maxPixels: deps.uploads.maxPixels,
  });
  const frames = createFramesService({
    db,
    storage: deps.storage,
    limits: { maxBytes: deps.uploads.maxBytes, maxPixels: deps.uploads.maxPixels },
    finals: retouch.finals,
  });

  // Before the API router: tus speaks its own content type, and checks access itself.
  mountFrameUploads(app, {
    frames,
    folder: deps.uploads.folder,
    maxBytes: deps.uploads.maxBytes,
    resolveViewer: (token) => auth.resolveViewer(token),
    logger,
    locker: deps.uploadLocker,
  });

  const api = express.Router();
  // Health comes before the cookie is resolved: it must answer while the database is down.
  const health = express.Router();
  const healthRoutes = new RouteTable(health);
  registerHealthRoutes(healthRoutes, {
    db,
    mail: mailbox ? 'local catcher' : 'smtp',
    notifications: deps.notifications,
    storage: deps.storage,
    runsJobs: deps.runsJobs,
    lifecycle: deps.lifecycle,
  });
  api.use(health);
  // Before the body is read: a cross-site change is refused whatever it carries.
  api.use(refuseCrossSiteChanges);
  api.use(express.json({ limit: '1mb' }));
  api.use(cookieParser());
  api.use(refuseControlCharacters);
  api.use(requireJsonForMutations);
  api.use(loadViewer((token) => auth.resolveViewer(token)));
  api.use((_req, res, next) => {
    res.setHeader('Cache-Control', 'no-store');
    next();
  });

  const routes = new RouteTable(api);
  registerAuthRoutes(routes, auth, db, config, clock);
  registerUsersRoutes(routes, users);
  registerClientsRoutes(routes, clients);
  registerSittersRoutes(routes, db);
  registerRosterRoutes(routes, roster);
  registerPeopleRoutes(routes, people);
  registerDaysRoutes(routes, days, booking);
  registerDayChangesRoutes(routes, createDayChangesService({ db, clock }));
  registerBookingRoutes(routes, booking);
  registerProgressRoutes(routes, progress, invitations);
  registerSetupCardsRoutes(routes, createSetupCardsService({ db }));
  registerFramesRoutes(routes, frames);
  registerMatchingRoutes(routes, createMatchingService({ db }));
  registerRetouchRoutes(routes, retouch);
  registerInvoicesRoutes(
    routes,
    createInvoicesService({
      db,
      clock,
      days,
      issuer: {
        name: config.studioName,
        address: config.studioAddress,
        taxId: config.studioTaxId,
      },
    }),
  );
  registerDeliveryRoutes(routes, createDeliveryService({ db, clock, storage: deps.storage }));
  registerLooksRoutes(
    routes,
    createLooksService({ db }),
    createPortraitsService({
      db,
      storage: deps.storage,
      logger,
      studioName: config.studioName,
      // Requests only mark eyes and serve files: the model runs in the worker's jobs.
      eyeFinder: () => {
        throw new Error('Eyes are found by the detect_eyes job, not in a request.');
      },
    }),
  );
  registerProofsRoutes(
    routes,
    proofsServiceFor({ db, clock, mailer, auth, reminderCooldownMs: config.reminderCooldownMs }),
    createSitterProofsService({
      db,
      clock,
      storage: deps.storage,
      urls: createProofUrls(config.proofUrls),
    }),
  );
  registerConsoleRoutes(
    routes,
    createConsoleService({ db, clock }),
    deps.notifications,
    deps.lifecycle,
  );
  registerDevMailboxRoutes(routes, mailbox);
  api.use(notFoundHandler());
  api.use(errorHandler(logger));

  app.use('/api', api);

  if (deps.frontend?.kind === 'static') {
    const folder = deps.frontend.folder;
    app.use(express.static(folder, { index: false, maxAge: '1h' }));
    // Client-side routes all answer with the app's page.
    app.get('/{*splat}', (_req, res) => {
      res.setHeader('Cache-Control', 'no-cache');
      res.sendFile(path.join(folder, 'index.html'));
    });
  } else if (deps.frontend?.kind === 'middleware') {
    app.use(deps.frontend.handler);
  }
  app.use(errorHandler(logger));

  return { app, routeTable: [...healthRoutes.entries, ...routes.entries] };
}
