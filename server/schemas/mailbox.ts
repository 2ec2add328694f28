import { z } from 'zod';

/** One message in the Mailbox list: no bodies, so the list stays small. */
export const caughtMailSummarySchema = z.object({
  id: z.string(),
  receivedAt: z.string(),
  from: z.string(),
  to: z.array(z.string()),
  subject: z.string(),
  attachmentCount: z.number().int(),
});
export type CaughtMailSummary = z.infer<typeof caughtMailSummarySchema>;

export const mailboxListSchema = z.object({ messages: z.array(caughtMailSummarySchema) });
export type MailboxList = z.infer<typeof mailboxListSchema>;

export const caughtAttachmentSchema = z.object({
  index: z.number().int(),
  filename: z.string(),
  contentType: z.string(),
  bytes: z.number().int(),
});
export type CaughtAttachment = z.infer<typeof caughtAttachmentSchema>;

/** One message opened: both parts (inline images already in the HTML) and its files. */
export const caughtMailSchema = caughtMailSummarySchema.extend({
  replyTo: z.string(),
  text: z.string(),
  html: z.string(),
  attachments: z.array(caughtAttachmentSchema),
});
export type CaughtMailMessage = z.infer<typeof caughtMailSchema>;

export const attachmentParamsSchema = z.object({
  messageId: z.string().min(1).max(100),
  index: z.coerce.number().int().min(0).max(1000),
});
