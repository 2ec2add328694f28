import { z } from 'zod';

export const healthSchema = z.object({
  status: z.enum(['ok', 'degraded']),
  database: z.object({ state: z.enum(['up', 'down']), latencyMs: z.number().nullable() }),
  /** The LISTEN connection behind live console updates; `off` when the process has none. */
  listener: z.object({
    state: z.enum(['listening', 'reconnecting', 'off']),
    reconnects: z.number().int().min(0),
    failedAttempts: z.number().int().min(0),
  }),
  mail: z.enum(['smtp', 'local catcher']),
  time: z.string(),
});
export type Health = z.infer<typeof healthSchema>;

/** Readiness: whether this process can do its work now (a load balancer sends it traffic). */
export const readinessSchema = z.object({
  ready: z.boolean(),
  database: z.enum(['up', 'down']),
  storage: z.enum(['up', 'down']),
  /** A worker's job queue (graphile-worker's schema); `off` in a process that runs no jobs. */
  queue: z.enum(['up', 'down', 'off']),
  /** True once the process has been told to stop: it finishes what it has and takes no more. */
  draining: z.boolean(),
});
export type Readiness = z.infer<typeof readinessSchema>;
