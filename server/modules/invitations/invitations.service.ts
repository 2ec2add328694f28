import type { Clock } from '../../adapters/clock';
import type { Mailer } from '../../adapters/mail/mailer';
import type { Db } from '../../db/database';
import { addJobs, type JobHandlers } from '../../jobs/job-queue';
import { recordAudit } from '../../lib/audit';
import { AppError } from '../../lib/errors';
import type { Viewer } from '../../lib/viewer';
import type { MailingLog, QueuedMailings } from '../../schemas/days';
import type { BookingService } from '../booking/booking.service';
import * as bookingRepo from '../booking/booking.repository';
import * as daysRepo from '../days/days.repository';
import type { DaysService } from '../days/days.service';
import { zonedTimeToInstant } from '../days/zoned-time';
import { invitationMail } from './invitations.mails';
import * as repo from './invitations.repository';
import { splitByCooldown } from './reminder-cooldown';

export type InvitationsService = ReturnType<typeof createInvitationsService>;
export const dayMailJob = 'day-mail';

export function createInvitationsService(deps: {
  db: Db;
  clock: Clock;
  mailer: Mailer;
  days: DaysService;
  booking: BookingService;
  issueSitterInvitationLink: (personId: string) => Promise<string>;
  /** One reminder per person and day within this time (REMINDER_COOLDOWN_HOURS). */
  reminderCooldownMs?: number;
}) {
  const { db, clock, mailer, days, booking } = deps;
  const cooldownMs = deps.reminderCooldownMs ?? 24 * 3_600_000;

  /** Who a reminder would reach now, and who waits out the cool-down (until when). */
  async function reminderPlan(executor: Db, day: daysRepo.DayRecord) {
    const booked = await repo.bookedPersonIds(executor, day.id);
    // Someone who already sat (a walk-in, say) is not asked to book.
    const came = await repo.checkedInPersonIds(executor, day.id);
    const unbooked = (await invitedIds(day)).filter((id) => !booked.has(id) && !came.has(id));
    const last = await repo.lastRemindedAt(executor, day.id);
    return {
      ...splitByCooldown(unbooked, last, clock.now().getTime(), cooldownMs),
      last,
      unbooked: new Set(unbooked),
    };
  }

  /** Booking has closed: a reminder to book would ask for what can no longer be done. */
  const bookingClosed = (day: daysRepo.DayRecord) =>
    clock.now().getTime() >= new Date(day.bookingClosesAt).getTime();

  async function confirmedDay(viewer: Viewer, dayId: string) {
    const day = await days.visibleDay(viewer, dayId);
    if (day.status !== 'confirmed') {
      throw new AppError('day_not_confirmed', 409, 'The studio has not confirmed this day yet.');
    }
    return day;
  }

  async function invitedIds(day: daysRepo.DayRecord): Promise<string[]> {
    const people = await daysRepo.invitedPeopleQuery(db, day).execute();
    return people.map((person) => person.id);
  }

  /** Mailings and their jobs are written together: a job never exists without its row. */
  async function queue(
    viewer: Viewer | null,
    day: daysRepo.DayRecord,
    // Reminders have their own path (remind), with the cool-down under the same lock.
    kind: 'invitation' | 'day_before',
    personIds: string[],
  ): Promise<QueuedMailings> {
    const inserted = await db.transaction().execute(async (trx) => {
      await daysRepo.lockDay(trx, day.id);
      const ids = await repo.insertMailings(trx, day.id, personIds, kind, 1);
      await addJobs(
        trx,
        dayMailJob,
        ids.map((mailingId) => ({ payload: { mailingId }, jobKey: `${dayMailJob}:${mailingId}` })),
      );
      await recordAudit(trx, {
        actorUserId: viewer?.kind === 'staff' ? viewer.id : null,
        action: `day.${kind}_queued`,
        subjectType: 'shoot_day',
        subjectId: day.id,
        details: { count: ids.length },
      });
      return ids.length;
    });
    return { queued: inserted, alreadyQueued: personIds.length - inserted };
  }

  async function sendMailing(mailingId: string, lastAttempt: boolean): Promise<void> {
    const mailing = await repo.findMailing(db, mailingId);
    if (!mailing || mailing.status !== 'queued') return; // already handled: never send twice
    // Proof and delivery mail share the log but are sent by their modules' own jobs.
    if (
      mailing.kind !== 'invitation' &&
      mailing.kind !== 'reminder' &&
      mailing.kind !== 'day_before'
    )
      return;
    const day = await daysRepo.findDay(db, mailing.dayId);
    const now = clock.now();
    if (!day || !mailing.active) {
      await repo.markMailing(db, mailingId, 'failed', 'No longer on the roster', now);
      return;
    }
    if (day.status === 'cancelled') {
      await repo.markMailing(db, mailingId, 'failed', 'Not sent: the day was cancelled', now);
      return;
    }
    try {
      if (mailing.kind === 'day_before') {
        const held = await bookingRepo.activeBookingOf(db, day.id, mailing.personId);
        if (!held) {
          await repo.markMailing(db, mailingId, 'failed', 'Not sent: booking cancelled', now);
          return;
        }
        await booking.sendMail('day_before', held.id);
      } else {
        const held = await bookingRepo.activeBookingOf(db, day.id, mailing.personId);
        if (held && mailing.kind === 'reminder') {
          await repo.markMailing(db, mailingId, 'failed', 'Not sent: booked meanwhile', now);
          return;
        }
        const url = await deps.issueSitterInvitationLink(mailing.personId);
        await mailer.send(
          invitationMail({ kind: mailing.kind, to: mailing.email, name: mailing.name, day, url }),
        );
      }
      await repo.markMailing(db, mailingId, 'sent', null, clock.now());
    } catch (error) {
      // Stays queued while the queue will retry; the reason is kept once it gives up.
      if (lastAttempt) {
        const reason = error instanceof Error ? error.message : String(error);
        await repo.markMailing(db, mailingId, 'failed', reason.slice(0, 300), clock.now());
      }
      throw error;
    }
  }

  return {
    async invite(viewer: Viewer, dayId: string): Promise<QueuedMailings> {
      const day = await confirmedDay(viewer, dayId);
      const already = await repo.personIdsWithMailing(db, dayId, 'invitation');
      const fresh = (await invitedIds(day)).filter((id) => !already.has(id));
      const result = await queue(viewer, day, 'invitation', fresh);
      return { ...result, alreadyQueued: result.alreadyQueued + already.size };
    },

    /**
     * Reminds the unbooked who have not had a reminder within the cool-down; the others are
     * counted, not mailed, so pressing the button again sends nothing new (and no new link).
     */
    async remind(viewer: Viewer, dayId: string): Promise<QueuedMailings> {
      const day = await confirmedDay(viewer, dayId);
      if (bookingClosed(day)) {
        throw new AppError(
          'booking_closed',
          409,
          'Booking for this day has closed, so a reminder would ask people to book a slot they can no longer book.',
        );
      }
      return db.transaction().execute(async (trx) => {
        // Under the day's lock, so two presses at once cannot both find the same people due.
        await daysRepo.lockDay(trx, day.id);
        const plan = await reminderPlan(trx, day);
        const nextReminderAt = plan.nextAt?.toISOString() ?? null;
        if (plan.due.length === 0) {
          return { queued: 0, alreadyQueued: 0, coolingDown: plan.coolingDown, nextReminderAt };
        }
        const round = await repo.bumpReminderRound(trx, day.id);
        const ids = await repo.insertMailings(
          trx,
          day.id,
          plan.due,
          'reminder',
          round,
          clock.now(),
        );
        await addJobs(
          trx,
          dayMailJob,
          ids.map((mailingId) => ({
            payload: { mailingId },
            jobKey: `${dayMailJob}:${mailingId}`,
          })),
        );
        await recordAudit(trx, {
          actorUserId: viewer.kind === 'staff' ? viewer.id : null,
          action: 'day.reminder_queued',
          subjectType: 'shoot_day',
          subjectId: day.id,
          details: { count: ids.length, coolingDown: plan.coolingDown },
        });
        // Everyone just reminded now waits out the cool-down too.
        const justNow = clock.now().getTime() + cooldownMs;
        const next = plan.nextAt ? Math.min(plan.nextAt.getTime(), justNow) : justNow;
        return {
          queued: ids.length,
          alreadyQueued: plan.due.length - ids.length,
          coolingDown: plan.coolingDown,
          nextReminderAt: new Date(next).toISOString(),
        };
      });
    },

    async log(viewer: Viewer, dayId: string): Promise<MailingLog> {
      const day = await days.visibleDay(viewer, dayId);
      const log = await repo.mailingLog(db, dayId);
      const plan = await reminderPlan(db, day);
      const closed = bookingClosed(day);
      // Reminders are still to come only while booking is open on a confirmed day.
      const remindable = day.status === 'confirmed' && !closed;
      // The latest reminder row of each person still unbooked says when their next one is
      // possible; someone who has booked since, or sat, is not reminded again.
      const latest = new Set<string>();
      const entries = log.entries.map((entry) => {
        const reminded = plan.last.get(entry.personId);
        if (entry.kind !== 'reminder' || !reminded || latest.has(entry.personId)) return entry;
        latest.add(entry.personId);
        if (!remindable || !plan.unbooked.has(entry.personId)) return entry;
        return {
          ...entry,
          nextReminderAt: new Date(reminded.getTime() + cooldownMs).toISOString(),
        };
      });
      return {
        ...log,
        entries,
        reminders: {
          cooldownHours: cooldownMs / 3_600_000,
          bookingClosed: closed,
          dueNow: remindable ? plan.due.length : 0,
          coolingDown: remindable ? plan.coolingDown : 0,
          nextAt: remindable ? (plan.nextAt?.toISOString() ?? null) : null,
        },
      };
    },

    /** Queues the day-before message for days starting within the next 36 hours. */
    async queueDueDayBefore(): Promise<number> {
      const now = clock.now().getTime();
      let queued = 0;
      for (const id of await repo.upcomingDayIds(db, clock.now())) {
        const day = await daysRepo.findDay(db, id);
        if (!day) continue;
        const opens = zonedTimeToInstant(day.date, day.opensAt, day.timeZone);
        if (opens - now > 36 * 3_600_000 || opens <= now) continue;
        const booked = [...(await repo.bookedPersonIds(db, id))];
        const sent = await repo.personIdsWithMailing(db, id, 'day_before');
        const due = booked.filter((personId) => !sent.has(personId));
        if (due.length > 0) queued += (await queue(null, day, 'day_before', due)).queued;
      }
      return queued;
    },

    handlers(): JobHandlers {
      return {
        [dayMailJob]: async (payload, attempt) => {
          const mailingId = (payload as { mailingId?: unknown }).mailingId;
          if (typeof mailingId === 'string') await sendMailing(mailingId, attempt.lastAttempt);
        },
      };
    },
  };
}
