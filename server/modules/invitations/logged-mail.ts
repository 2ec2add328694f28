import type { Clock } from '../../adapters/clock';
import type { Mailer, OutgoingMail } from '../../adapters/mail/mailer';
import type { Db } from '../../db/database';
import type { MailingKind } from '../../schemas/days';
import * as mailings from './invitations.repository';

type Mailing = NonNullable<Awaited<ReturnType<typeof mailings.findMailing>>>;

/**
 * Sends one logged mailing once: skips one already handled, records why one is not sent, and
 * keeps a failure's reason once the queue gives up (it stays queued while retries remain).
 * `compose` returns the mail, or the reason it is not to be sent.
 */
export async function sendLoggedMailing(
  deps: { db: Db; clock: Clock; mailer: Mailer },
  mailingId: string,
  lastAttempt: boolean,
  kinds: readonly MailingKind[],
  compose: (mailing: Mailing) => Promise<OutgoingMail | { notSent: string }>,
) {
  const { db, clock } = deps;
  const mailing = await mailings.findMailing(db, mailingId);
  if (!mailing || mailing.status !== 'queued' || !kinds.includes(mailing.kind)) return;
  if (!mailing.active) {
    await mailings.markMailing(db, mailingId, 'failed', 'No longer on the roster', clock.now());
    return;
  }
  try {
    const mail = await compose(mailing);
    if ('notSent' in mail) {
      await mailings.markMailing(db, mailingId, 'failed', mail.notSent, clock.now());
      return;
    }
    await deps.mailer.send(mail);
    await mailings.markMailing(db, mailingId, 'sent', null, clock.now());
  } catch (error) {
    if (lastAttempt) {
      const reason = error instanceof Error ? error.message : String(error);
      await mailings.markMailing(db, mailingId, 'failed', reason.slice(0, 300), clock.now());
    }
    throw error;
  }
}
