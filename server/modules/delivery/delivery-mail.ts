import type { Clock } from '../../adapters/clock';
import type { Mailer } from '../../adapters/mail/mailer';
import { renderMail } from '../../adapters/mail/render-mail';
import type { Db } from '../../db/database';
import { addJobs, type JobHandlers } from '../../jobs/job-queue';
import { findDay } from '../days/days.repository';
import { sendLoggedMailing } from '../invitations/logged-mail';
import { activeCoordinators } from '../users/users.repository';
import {
  issueDownloadLink,
  PORTRAITS_MAIL_TASK,
  SET_RELEASED_HR_MAIL_TASK,
} from './delivery.service';

/** "Your portraits are ready": each sitter's personal link, sent once per release that changed theirs. */
export function portraitsMailTasks(deps: {
  db: Db;
  clock: Clock;
  mailer: Mailer;
  publicUrl: string;
}): JobHandlers {
  const { db, clock } = deps;
  const send = (mailingId: string, lastAttempt: boolean) =>
    sendLoggedMailing(deps, mailingId, lastAttempt, ['portraits_ready'], async (mailing) => {
      const day = await findDay(db, mailing.dayId);
      if (!day) return { notSent: 'The day was deleted' };
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
      return {
        to: mailing.email,
        subject: `Your ${day.clientName} portraits are ready`,
        ...content,
      };
    });
  return {
    [PORTRAITS_MAIL_TASK]: async (payload, attempt) => {
      const mailingId = (payload as { mailingId?: unknown }).mailingId;
      if (typeof mailingId === 'string') await send(mailingId, attempt.lastAttempt);
    },
    // HR learns of a release without having to look: each active coordinator of the client,
    // one job each, so a send that fails is tried again for that coordinator only.
    [SET_RELEASED_HR_MAIL_TASK]: async (payload) => {
      const { dayId, release, userId } = payload as {
        dayId?: unknown;
        release?: unknown;
        userId?: unknown;
      };
      if (typeof dayId !== 'string' || typeof release !== 'number') return;
      const day = await findDay(db, dayId);
      if (!day) return;
      const coordinators = await activeCoordinators(db, day.clientId);
      if (userId === undefined) {
        await addJobs(
          db,
          SET_RELEASED_HR_MAIL_TASK,
          coordinators.map((coordinator) => ({
            payload: { dayId, release, userId: coordinator.id },
            jobKey: `set-released-hr:${dayId}:${release}:${coordinator.id}`,
          })),
        );
        return;
      }
      const coordinator = coordinators.find((candidate) => candidate.id === userId);
      if (!coordinator) return;
      const content = renderMail({
        heading: `Hello ${coordinator.displayName},`,
        paragraphs: [
          release === 1
            ? `The portraits of ${day.clientName}'s ${day.officeName} shoot day on ${day.date} are ready to download, with their manifest.`
            : `Release ${release} of the portraits of ${day.clientName}'s ${day.officeName} shoot day on ${day.date} is ready: the manifest says which files are new or changed.`,
        ],
        action: { label: 'Open the day', url: `${deps.publicUrl}/days/${day.id}` },
      });
      await deps.mailer.send({
        to: coordinator.email,
        subject: `Portraits ready: ${day.officeName}, ${day.date}`,
        ...content,
      });
    },
  };
}
