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
}

const tooMany = () =>
  new AppError(
    'rate_limited',
    429,
    'Too many attempts. Please wait a few minutes before trying again.',
  );

/**
 * A limit per client address for one action. There is deliberately no limit per account: one
 * that anybody can fill locks the owner out (sign-in-backoff.ts slows guessing per pair instead).
 */
export function createRateLimits(
  db: Db,
  action: string,
  settings: RateLimitSettings,
  options: { onlyFailures?: boolean } = {},
): RequestHandler[] {
  return [
    rateLimit({
      windowMs: settings.windowMs,
      standardHeaders: 'draft-8',
      legacyHeaders: false,
      handler: (_req: Request, _res: unknown, next: (error: unknown) => void) => next(tooMany()),
      // Signing in correctly again (another tablet, another browser) is not an attack.
      skipSuccessfulRequests: options.onlyFailures ?? false,
      limit: settings.perAddress,
      store: new PostgresRateLimitStore(db, `${action}:address:`),
    }),
  ];
}
