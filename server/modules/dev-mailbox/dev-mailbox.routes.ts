import type { Mailbox } from '../../adapters/mail/mail-catcher';
import { AppError, notFound } from '../../lib/errors';
import type { RouteTable } from '../../lib/route-table';

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

  routes.add('get', '/dev/mailbox', ['studio_admin'], (_req, res) => {
    res.json({ messages: requireMailbox().list() });
  });

  routes.add('get', '/dev/mailbox/:messageId', ['studio_admin'], (req, res) => {
    const message = requireMailbox().get(String(req.params.messageId));
    if (!message) throw notFound('That message');
    res.json(message);
  });
}
