import type { CaughtMail, Mailbox } from '../../adapters/mail/mail-catcher';
import { AppError, notFound } from '../../lib/errors';
import type { RouteTable } from '../../lib/route-table';
import { parseId, parseInput } from '../../lib/validate';
import {
  attachmentParamsSchema,
  type CaughtMailMessage,
  type CaughtMailSummary,
} from '../../schemas/mailbox';

const summary = (message: CaughtMail): CaughtMailSummary => ({
  id: message.id,
  receivedAt: message.receivedAt,
  from: message.from,
  to: message.to,
  subject: message.subject,
  attachmentCount: message.attachments.length,
});

/**
 * The local mail catcher's inbox, for development only: lets the studio admin follow every
 * link the product sends without a real mail server. Absent when SMTP_URL is set.
 */
export function registerDevMailboxRoutes(routes: RouteTable, mailbox: Mailbox | null) {
  const requireMailbox = (): Mailbox => {
    if (!mailbox) {
      throw new AppError(
        'mailbox_off',
        404,
        'The development mailbox is off: mail goes to a real server.',
      );
    }
    return mailbox;
  };
  const findMessage = (messageId: unknown) => {
    const message = requireMailbox().get(parseId(messageId, 'That message'));
    if (!message) throw notFound('That message');
    return message;
  };

  routes.add('get', '/dev/mailbox', ['studio_admin'], (_req, res) => {
    res.json({ messages: requireMailbox().list().map(summary) });
  });

  routes.add('get', '/dev/mailbox/:messageId', ['studio_admin'], (req, res) => {
    const message = findMessage(req.params.messageId);
    const opened: CaughtMailMessage = {
      ...summary(message),
      replyTo: message.replyTo,
      text: message.text,
      html: message.html,
      attachments: message.attachments.map((attachment, index) => ({
        index,
        filename: attachment.filename,
        contentType: attachment.contentType,
        bytes: Buffer.byteLength(attachment.content, 'base64'),
      })),
    };
    res.json(opened);
  });

  routes.add('get', '/dev/mailbox/:messageId/attachments/:index', ['studio_admin'], (req, res) => {
    const { index } = parseInput(attachmentParamsSchema, req.params);
    const attachment = findMessage(req.params.messageId).attachments[index];
    if (!attachment) throw notFound('That attachment');
    const name = attachment.filename || `attachment-${index + 1}`;
    // Always a download: a caught file is never run or shown inside the app's own origin.
    res.setHeader('Content-Type', attachment.contentType || 'application/octet-stream');
    res.setHeader(
      'Content-Disposition',
      `attachment; filename*=UTF-8''${encodeURIComponent(name)}`,
    );
    res.send(Buffer.from(attachment.content, 'base64'));
  });
}
