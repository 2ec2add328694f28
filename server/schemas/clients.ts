import { z } from 'zod';

export const createClientRequestSchema = z.object({
  name: z
    .string({ error: 'Enter the client company name.' })
    .trim()
    .min(2, { error: 'Use at least 2 characters.' })
    .max(120, { error: 'Use at most 120 characters.' }),
});
export type CreateClientRequest = z.infer<typeof createClientRequestSchema>;

export const officeSummarySchema = z.object({
  id: z.string(),
  name: z.string(),
  timeZone: z.string(),
  activePeople: z.number(),
});

export const clientSchema = z.object({
  id: z.string(),
  name: z.string(),
  slug: z.string(),
  createdAt: z.string(),
  activePeople: z.number(),
  coordinators: z.number(),
  offices: z.array(officeSummarySchema),
});
export type Client = z.infer<typeof clientSchema>;

export const clientListSchema = z.object({ clients: z.array(clientSchema) });
export type ClientList = z.infer<typeof clientListSchema>;
