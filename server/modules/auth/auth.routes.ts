import type { Clock } from '../../adapters/clock';
import type { Db } from '../../db/database';
import type { AppConfig } from '../../config';
import { AppError } from '../../lib/errors';
import { createRateLimits } from '../../lib/rate-limit';
import { createBackoff } from '../../lib/sign-in-backoff';
import type { RouteTable } from '../../lib/route-table';
import { viewerOf } from '../../lib/route-table';
import { clearSessionCookie, requestMeta, setSessionCookie } from '../../lib/session-cookie';
import { parseInput } from '../../lib/validate';
import {
  linkTokenSchema,
  passwordResetRequestSchema,
  setPasswordRequestSchema,
  signInLinkRequestSchema,
  signInRequestSchema,
} from '../../schemas/auth';
import type { AuthService } from './auth.service';

const everyone = ['studio_admin', 'photographer', 'coordinator', 'sitter'] as const;

const LINK_SENT =
  'If that address belongs to someone on a roster, a sign-in link is on its way. Check your inbox.';
const RESET_SENT =
  'If that address belongs to an active account, a link to choose a new password is on its way.';

export function registerAuthRoutes(
  routes: RouteTable,
  auth: AuthService,
  db: Db,
  config: AppConfig,
  clock: Clock,
) {
  const signInLimits = createRateLimits(db, 'sign-in', config.rateLimit, { onlyFailures: true });
  const linkLimits = createRateLimits(db, 'sign-in-link', config.rateLimit);
  const resetLimits = createRateLimits(db, 'password-reset', config.rateLimit);
  const redeemLimits = createRateLimits(db, 'link-redeem', config.rateLimit);
  const signInBackoff = createBackoff(db, clock, 'sign-in', config.signInBackoff);
  const linkBackoff = createBackoff(db, clock, 'sign-in-link', config.signInBackoff);
  const resetBackoff = createBackoff(db, clock, 'password-reset', config.signInBackoff);

  routes.add(
    'post',
    '/session',
    'public',
    async (req, res) => {
      const input = parseInput(signInRequestSchema, req.body);
      await signInBackoff.check(req, res, input.email);
      const started = await auth.signIn(input, requestMeta(req)).catch(async (error: unknown) => {
        if (error instanceof AppError && error.code === 'wrong_credentials') {
          await signInBackoff.record(req, input.email);
        }
        throw error;
      });
      await signInBackoff.clear(req, input.email);
      setSessionCookie(req, res, started.token, started.viewer.sessionExpiresAt);
      res.status(201).json(await auth.describe(started.viewer));
    },
    ...signInLimits,
  );

  routes.add('get', '/session', everyone, async (req, res) => {
    res.json(await auth.describe(viewerOf(req)));
  });

  routes.add('delete', '/session', 'public', async (req, res) => {
    if (req.viewer) await auth.signOut(req.viewer.sessionId);
    clearSessionCookie(req, res);
    res.status(204).end();
  });

  routes.add('get', '/sessions', everyone, async (req, res) => {
    res.json(await auth.sessionsOf(viewerOf(req)));
  });

  // "Sign out everywhere": every other session of the viewer ends; this one stays.
  routes.add('delete', '/sessions', everyone, async (req, res) => {
    res.json(await auth.signOutElsewhere(viewerOf(req)));
  });

  routes.add(
    'post',
    '/sign-in-links',
    'public',
    async (req, res) => {
      const { email } = parseInput(signInLinkRequestSchema, req.body);
      await linkBackoff.check(req, res, email);
      await linkBackoff.record(req, email);
      await auth.requestSitterLink(email);
      res.status(202).json({ message: LINK_SENT });
    },
    ...linkLimits,
  );

  routes.add(
    'post',
    '/sign-in-links/redeem',
    'public',
    async (req, res) => {
      const { token } = parseInput(linkTokenSchema, req.body);
      const started = await auth.redeemSitterLink(token, requestMeta(req));
      setSessionCookie(req, res, started.token, started.viewer.sessionExpiresAt);
      res.status(201).json(await auth.describe(started.viewer));
    },
    ...redeemLimits,
  );

  routes.add(
    'post',
    '/password-resets',
    'public',
    async (req, res) => {
      const { email } = parseInput(passwordResetRequestSchema, req.body);
      await resetBackoff.check(req, res, email);
      await resetBackoff.record(req, email);
      await auth.requestPasswordReset(email);
      res.status(202).json({ message: RESET_SENT });
    },
    ...resetLimits,
  );

  routes.add(
    'post',
    '/passwords',
    'public',
    async (req, res) => {
      const input = parseInput(setPasswordRequestSchema, req.body);
      const started = await auth.completePasswordLink(input, requestMeta(req));
      setSessionCookie(req, res, started.token, started.viewer.sessionExpiresAt);
      res.status(201).json(await auth.describe(started.viewer));
    },
    ...redeemLimits,
  );
}
