import type { Request, RequestHandler } from 'express';
import { rateLimit, type IncrementResponse, type Store } from 'express-rate-limit';
import { sql } from 'kysely';
import type { Db } from '../db/database';
import { AppError } from './errors';

/**
 * Counters live in PostgreSQL so that several app processes share one limit.
 * One upsert per hit: a fixed window that restarts once it has passed.
 */
class PostgresRateLimitStore implements Store {
  localKeys = false;
  private windowMs = 60_000;

  constructor(
    private readonly db: Db,
    readonly prefix: string,
  ) {}

  init(options: { windowMs: number }) {
    this.windowMs = options.windowMs;
  }

  async increment(key: string): Promise<IncrementResponse> {
    const resetsAt = sql<Date>`now() + ${`${this.windowMs} milliseconds`}::interval`;
    const row = await this.db
      .insertInto('rateLimitCounters')
      .values({ key: this.prefix + key, hits: 1, resetsAt })
      .onConflict((conflict) =>
        conflict.column('key').doUpdateSet({
          hits: sql`case when rate_limit_counters.resets_at <= now() then 1 else rate_limit_counters.hits + 1 end`,
          resetsAt: sql`case when rate_limit_counters.resets_at <= now() then ${resetsAt} else rate_limit_counters.resets_at end`,
        }),
      )
      .returning(['hits', 'resetsAt'])
      .executeTakeFirstOrThrow();
    return { totalHits: row.hits, resetTime: new Date(row.resetsAt) };
  }

  async decrement(key: string): Promise<void> {
    await this.db
      .updateTable('rateLimitCounters')
      .set({ hits: sql`greatest(hits - 1, 0)` })
      .where('key', '=', this.prefix + key)
      .execute();
  }

  async resetKey(key: string): Promise<void> {
    await this.db
      .deleteFrom('rateLimitCounters')
      .where('key', '=', this.prefix + key)
      .execute();
  }
}

export interface RateLimitSettings {
  windowMs: number;
  perAddress: number;
  perAccount: number;
}

const tooMany = () =>
  new AppError(
    'rate_limited',
    429,
    'Too many attempts. Please wait a few minutes before trying again.',
  );

function accountKey(req: Request): string {
  const body: unknown = req.body;
  const email =
    typeof body === 'object' && body !== null && 'email' in body && typeof body.email === 'string'
      ? body.email.trim().toLowerCase()
      : '';
  return email || 'no-email';
}

/** Limits per client address and per account (the e-mail in the body) for one action. */
export function createRateLimits(
  db: Db,
  action: string,
  settings: RateLimitSettings,
  options: { byAccount?: boolean; onlyFailures?: boolean } = {},
): RequestHandler[] {
  const byAccount = options.byAccount ?? true;
  const common = {
    windowMs: settings.windowMs,
    standardHeaders: 'draft-8' as const,
    legacyHeaders: false,
    // Both limits answer the same way, whether or not the e-mail is known.
    handler: (_req: Request, _res: unknown, next: (error: unknown) => void) => next(tooMany()),
    // Signing in correctly again (another tablet, another browser) is not an attack.
    skipSuccessfulRequests: options.onlyFailures ?? false,
  };
  const limits = [
    rateLimit({
      ...common,
      limit: settings.perAddress,
      store: new PostgresRateLimitStore(db, `${action}:address:`),
    }),
    rateLimit({
      ...common,
      limit: settings.perAccount,
      keyGenerator: accountKey,
      store: new PostgresRateLimitStore(db, `${action}:account:`),
    }),
  ];
  // Requests without an e-mail (link redemption) would all share one account key.
  return byAccount ? limits : limits.slice(0, 1);
}
