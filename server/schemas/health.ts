import { z } from 'zod';

export const healthSchema = z.object({
  status: z.enum(['ok', 'degraded']),
  database: z.object({ state: z.enum(['up', 'down']), latencyMs: z.number().nullable() }),
  mail: z.enum(['smtp', 'local catcher']),
  time: z.string(),
});
export type Health = z.infer<typeof healthSchema>;
