import type { CaughtMail, CaughtMailStore } from '../../adapters/mail/mail-catcher';
import type { Db } from '../../db/database';

/** The mail catcher's messages in the database, so the Mailbox survives a restart. */
export function createCaughtMailStore(db: Db): CaughtMailStore {
  return {
    async load(limit) {
      const rows = await db
        .selectFrom('caughtMails')
        .selectAll()
        .orderBy('receivedAt', 'desc')
        .orderBy('id', 'desc')
        .limit(limit)
        .execute();
      return rows.map((row): CaughtMail => ({
        id: row.id,
        receivedAt: row.receivedAt.toISOString(),
        from: row.fromText,
        replyTo: row.replyTo,
        to: row.toAddresses,
        subject: row.subject,
        text: row.textBody,
        html: row.htmlBody,
        attachments: row.attachments,
      }));
    },
    async save(message, keep) {
      await db.transaction().execute(async (trx) => {
        await trx
          .insertInto('caughtMails')
          .values({
            id: message.id,
            receivedAt: message.receivedAt,
            fromText: message.from,
            replyTo: message.replyTo,
            toAddresses: message.to,
            subject: message.subject,
            textBody: message.text,
            htmlBody: message.html,
            attachments: JSON.stringify(message.attachments),
          })
          .execute();
        // Only the newest `keep` are shown; older ones would only fill the disk.
        await trx
          .deleteFrom('caughtMails')
          .where(
            'id',
            'not in',
            trx
              .selectFrom('caughtMails')
              .select('id')
              .orderBy('receivedAt', 'desc')
              .orderBy('id', 'desc')
              .limit(keep),
          )
          .execute();
      });
    },
  };
}
