import { z } from 'zod';

export const caughtMailSchema = z.object({
  id: z.string(),
  receivedAt: z.string(),
  from: z.string(),
  to: z.array(z.string()),
  subject: z.string(),
  text: z.string(),
  html: z.string(),
});
export type CaughtMailMessage = z.infer<typeof caughtMailSchema>;

export const mailboxListSchema = z.object({ messages: z.array(caughtMailSchema) });
export type MailboxList = z.infer<typeof mailboxListSchema>;
