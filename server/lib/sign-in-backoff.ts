import type { Request, Response } from 'express';
import { sql } from 'kysely';
import type { Clock } from '../adapters/clock';
import type { Db } from '../db/database';
import { AppError } from './errors';
import { hashToken } from './secrets';

export interface BackoffSettings {
  /** Attempts a pair gets before it has to wait at all (typing mistakes are normal). */
  freeAttempts: number;
  /** The first wait; each further attempt doubles it, up to maxDelayMs. */
  firstDelayMs: number;
  maxDelayMs: number;
}

// A pair that has been quiet this long starts afresh: last week's typo costs nothing today.
const FORGET_AFTER_MS = 24 * 3_600_000;

/** The wait after the n-th counted attempt: none while free, then doubling, capped. */
export function delayAfter(attempts: number, settings: BackoffSettings): number {
  const beyondFree = attempts - settings.freeAttempts;
  if (beyondFree <= 0) return 0;
  return Math.min(settings.maxDelayMs, settings.firstDelayMs * 2 ** (beyondFree - 1));
}

function waitMessage(ms: number): string {
  const seconds = Math.ceil(ms / 1000);
  const wait =
    seconds < 120
      ? `${seconds} second${seconds === 1 ? '' : 's'}`
      : `${Math.ceil(seconds / 60)} minutes`;
  return `Too many attempts from here for this address. Wait ${wait}, then try again.`;
}

/**
 * A growing wait per client address and account (the e-mail typed), instead of a lock on the
 * account: guessing from one place slows down, the owner signing in from anywhere else is not
 * touched, and even from the same place the wait is bounded. Known and unknown e-mails are
 * treated alike, so the answer says nothing about which accounts exist.
 */
export function createBackoff(db: Db, clock: Clock, action: string, settings: BackoffSettings) {
  const keyOf = (req: Request, email: string) =>
    hashToken(`${action}\u0001${req.ip ?? 'unknown'}\u0001${email.trim().toLowerCase()}`);

  return {
    /** Refuses with 429 and Retry-After while the pair must still wait. */
    async check(req: Request, res: Response, email: string): Promise<void> {
      const row = await db
        .selectFrom('signInBackoff')
        .select(['nextAllowedAt'])
        .where('key', '=', keyOf(req, email))
        .executeTakeFirst();
      const waitMs = row?.nextAllowedAt
        ? new Date(row.nextAllowedAt).getTime() - clock.now().getTime()
        : 0;
      if (waitMs > 0) {
        res.setHeader('Retry-After', String(Math.ceil(waitMs / 1000)));
        throw new AppError('rate_limited', 429, waitMessage(waitMs), {
          retryAfterSeconds: Math.ceil(waitMs / 1000),
        });
      }
    },

    /** Counts one attempt for the pair (a failed password, or any link request). */
    async record(req: Request, email: string): Promise<void> {
      const now = clock.now();
      const forgetBefore = new Date(now.getTime() - FORGET_AFTER_MS);
      const row = await db
        .insertInto('signInBackoff')
        .values({ key: keyOf(req, email), attempts: 1, lastAttemptAt: now, nextAllowedAt: null })
        .onConflict((conflict) =>
          conflict.column('key').doUpdateSet({
            attempts: sql`case when sign_in_backoff.last_attempt_at < ${forgetBefore} then 1 else sign_in_backoff.attempts + 1 end`,
            lastAttemptAt: now,
          }),
        )
        .returning(['attempts'])
        .executeTakeFirstOrThrow();
      const delayMs = delayAfter(row.attempts, settings);
      await db
        .updateTable('signInBackoff')
        .set({ nextAllowedAt: delayMs > 0 ? new Date(now.getTime() + delayMs) : null })
        .where('key', '=', keyOf(req, email))
        .execute();
    },

    /** A correct sign-in ends the pair's record. */
    async clear(req: Request, email: string): Promise<void> {
      await db.deleteFrom('signInBackoff').where('key', '=', keyOf(req, email)).execute();
    },
  };
}

export type Backoff = ReturnType<typeof createBackoff>;
