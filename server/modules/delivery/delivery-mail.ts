import type { Clock } from '../../adapters/clock';
import type { Mailer } from '../../adapters/mail/mailer';
import { renderMail } from '../../adapters/mail/render-mail';
import type { Db } from '../../db/database';
import type { JobHandlers } from '../../jobs/job-queue';
import { findDay } from '../days/days.repository';
import * as mailings from '../invitations/invitations.repository';
import { issueDownloadLink, PORTRAITS_MAIL_TASK } from './delivery.service';

/** "Your portraits are ready": each sitter's personal link, sent once per release that changed theirs. */
export function portraitsMailTasks(deps: {
  db: Db;
  clock: Clock;
  mailer: Mailer;
  publicUrl: string;
}): JobHandlers {
  const { db, clock } = deps;
  async function send(mailingId: string, lastAttempt: boolean) {
    const mailing = await mailings.findMailing(db, mailingId);
    if (!mailing || mailing.status !== 'queued' || mailing.kind !== 'portraits_ready') return;
    const day = await findDay(db, mailing.dayId);
    if (!day || !mailing.active) {
      await mailings.markMailing(db, mailingId, 'failed', 'No longer on the roster', clock.now());
      return;
    }
    try {
      const token = await issueDownloadLink(db, clock, day.id, mailing.personId);
      const content = renderMail({
        heading: `Hello ${mailing.name},`,
        paragraphs: [
          `Your finished ${day.clientName} portraits are ready to download.`,
          'The same files have gone to your HR team for the staff directory and badges.',
        ],
        action: { label: 'Download my portraits', url: `${deps.publicUrl}/portraits/${token}` },
        footnote:
          'This link is personal and works for 30 days. You can also sign in to download again.',
      });
      await deps.mailer.send({
        to: mailing.email,
        subject: `Your ${day.clientName} portraits are ready`,
        ...content,
      });
      await mailings.markMailing(db, mailingId, 'sent', null, clock.now());
    } catch (error) {
      if (lastAttempt) {
        const reason = error instanceof Error ? error.message : String(error);
        await mailings.markMailing(db, mailingId, 'failed', reason.slice(0, 300), clock.now());
      }
      throw error;
    }
  }
  return {
    [PORTRAITS_MAIL_TASK]: async (payload, attempt) => {
      const mailingId = (payload as { mailingId?: unknown }).mailingId;
      if (typeof mailingId === 'string') await send(mailingId, attempt.lastAttempt);
    },
  };
}
