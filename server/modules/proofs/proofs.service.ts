import { randomUUID } from 'node:crypto';
import type { Transaction } from 'kysely';
import type { Clock } from '../../adapters/clock';
import type { Mailer } from '../../adapters/mail/mailer';
import type { Db } from '../../db/database';
import type { Database } from '../../db/types';
import { addJob, addJobs, type JobHandlers } from '../../jobs/job-queue';
import { recordAudit } from '../../lib/audit';
import { AppError, forbidden, notFound } from '../../lib/errors';
import type { Viewer } from '../../lib/viewer';
import type { ProofProgress, ProofSettingsInput } from '../../schemas/proofs';
import { findDay, lockDay, type DayRecord } from '../days/days.repository';
import { findFollowedDay, findStudioDay } from '../days/studio-day-access';
import { zonedTimeToInstant } from '../days/zoned-time';
import * as mailings from '../invitations/invitations.repository';
import { splitByCooldown } from '../invitations/reminder-cooldown';
import { sendLoggedMailing } from '../invitations/logged-mail';
import { proofsMail, type ProofMailKind } from './proofs.mails';
import * as repo from './proofs.repository';

export const PROOF_MAIL_TASK = 'proof-mail';
export const SETTLE_PICKS_TASK = 'settle-picks';
const DAY = 24 * 3_600_000;
type Trx = Transaction<Database>;

export type ProofsService = ReturnType<typeof createProofsService>;

/** The studio's and the coordinator's side of proofs: release, remind, progress, settle. */
export function createProofsService(deps: {
  db: Db;
  clock: Clock;
  mailer: Mailer;
  issueSitterLink: (personId: string, next: string) => Promise<string>;
  /** One proof reminder per person and day within this time (REMINDER_COOLDOWN_HOURS). */
  reminderCooldownMs?: number;
}) {
  const { db, clock } = deps;
  const cooldownMs = deps.reminderCooldownMs ?? DAY;

  const visibleDay = (viewer: Viewer, dayId: string) => findFollowedDay(db, viewer, dayId);

  async function queueMail(
    viewer: Viewer,
    day: DayRecord,
    kind: ProofMailKind,
    personIds: string[],
  ) {
    return db.transaction().execute((trx) => queueMailWith(trx, viewer, day, kind, personIds));
  }

  async function queueMailWith(
    trx: Trx,
    viewer: Viewer,
    day: DayRecord,
    kind: ProofMailKind,
    personIds: string[],
  ) {
    let round = 1;
    if (kind === 'proofs_reminder') {
      const bumped = await trx
        .updateTable('dayProofs')
        .set((eb) => ({ reminderRounds: eb('reminderRounds', '+', 1) }))
        .where('dayId', '=', day.id)
        .returning('reminderRounds')
        .executeTakeFirstOrThrow();
      round = bumped.reminderRounds;
    } else if (kind === 'proofs_deadline') {
      // Each move of the deadline is a round of its own, so a second move is mailed too.
      round = await mailings.nextRound(trx, day.id, kind);
    }
    const ids = await mailings.insertMailings(trx, day.id, personIds, kind, round);
    await addJobs(
      trx,
      PROOF_MAIL_TASK,
      ids.map((mailingId) => ({ payload: { mailingId }, jobKey: `proof-mail:${mailingId}` })),
    );
    await recordAudit(trx, {
      actorUserId: viewer.id,
      action: `proofs.${kind}_queued`,
      subjectType: 'shoot_day',
      subjectId: day.id,
      details: { count: ids.length },
    });
    return ids.length;
  }

  const sendMail = (mailingId: string, lastAttempt: boolean) =>
    sendLoggedMailing(
      deps,
      mailingId,
      lastAttempt,
      ['proofs', 'proofs_reminder', 'proofs_deadline'],
      async (mailing) => {
        const [day, proofs] = await Promise.all([
          findDay(db, mailing.dayId),
          repo.dayProofs(db, mailing.dayId),
        ]);
        if (!day || !proofs) return { notSent: 'No longer on the roster' };
        if (mailing.kind === 'proofs_reminder') {
          const picked = await repo.pickedPersonIds(db, day.id);
          if (picked.has(mailing.personId)) return { notSent: 'Not sent: picked meanwhile' };
        }
        const settings = await repo.proofSettings(db, day.clientId);
        return proofsMail({
          kind: mailing.kind as ProofMailKind,
          to: mailing.email,
          name: mailing.name,
          day,
          picksCloseAt: proofs.picksCloseAt,
          picksIncluded: settings.picksIncluded,
          url: await deps.issueSitterLink(mailing.personId, `/proofs/${day.id}`),
        });
      },
    );

  /** After the deadline: the studio's pick, else the first frame after the slate, stands. */
  async function settle(dayId: string) {
    const proofs = await repo.dayProofs(db, dayId);
    if (!proofs || proofs.settledAt || proofs.picksCloseAt.getTime() > clock.now().getTime()) {
      return;
    }
    const [people, picked, studio] = await Promise.all([
      repo.peopleWithProofs(db, dayId),
      repo.pickedPersonIds(db, dayId),
      repo.studioPicks(db, dayId),
    ]);
    const studioPick = new Map(studio.map((pick) => [pick.personId, pick.frameId]));
    await db.transaction().execute(async (trx) => {
      for (const person of people) {
        if (picked.has(person.id)) continue;
        const chosen = studioPick.get(person.id);
        const frameId = chosen ?? (await repo.proofFramesOf(trx, dayId, person.id))[0]?.id;
        if (!frameId) continue;
        await repo.replacePicks(trx, {
          dayId,
          personId: person.id,
          chosenBy: chosen ? 'studio' : 'fallback',
          chosenByUserId: null,
          picks: [{ id: randomUUID(), frameId, note: null }],
        });
      }
      await trx
        .updateTable('dayProofs')
        .set({ settledAt: clock.now() })
        .where('dayId', '=', dayId)
        .execute();
    });
  }

  return {
    visibleDay,

    async settings(viewer: Viewer, clientId: string) {
      if (viewer.role !== 'studio_admin') throw forbidden('Only the studio sets packages.');
      return repo.proofSettings(db, clientId);
    },

    async saveSettings(viewer: Viewer, clientId: string, input: ProofSettingsInput) {
      const client = await db
        .selectFrom('clients')
        .where('id', '=', clientId)
        .select('id')
        .executeTakeFirst();
      if (!client) throw notFound('That client');
      await repo.saveProofSettings(db, clientId, input);
      await recordAudit(db, {
        actorUserId: viewer.id,
        action: 'client.proof_settings_changed',
        subjectType: 'client',
        subjectId: clientId,
        details: { ...input },
      });
      return input;
    },

    /**
     * Sends each photographed sitter their proofs (once each; a second release reaches only
     * those matched since) and sets the pick deadline, by default 7 days after the shoot.
     */
    async release(viewer: Viewer, dayId: string, input: { picksCloseOn?: string | undefined }) {
      const day = await findStudioDay(db, viewer, dayId);
      const closeOn =
        input.picksCloseOn ??
        new Date(Date.parse(`${day.date}T00:00:00Z`) + 7 * DAY).toISOString().slice(0, 10);
      const picksCloseAt = new Date(zonedTimeToInstant(closeOn, '23:59', day.timeZone));
      if (closeOn < day.date || picksCloseAt.getTime() <= clock.now().getTime()) {
        throw new AppError(
          'invalid_input',
          400,
          'The pick deadline must be after the shoot and still ahead.',
          {
            fieldErrors: { picksCloseOn: ['Choose a later date.'] },
          },
        );
      }
      const people = await repo.peopleWithProofs(db, day.id);
      if (people.length === 0) {
        throw new AppError(
          'nothing_to_send',
          409,
          'No sitter has matched frames with previews yet: upload and match first.',
        );
      }
      const before = await repo.dayProofs(db, day.id);
      await db.transaction().execute(async (trx) => {
        await trx
          .insertInto('dayProofs')
          .values({ dayId: day.id, releasedByUserId: viewer.id, picksCloseAt })
          .onConflict((conflict) =>
            conflict.column('dayId').doUpdateSet({ picksCloseAt, settledAt: null }),
          )
          .execute();
        // The deadline's job: settles the picks of those who did not choose.
        await addJob(
          trx,
          SETTLE_PICKS_TASK,
          { dayId: day.id },
          { jobKey: `settle-picks:${day.id}`, runAt: picksCloseAt },
        );
      });
      const mailed = await mailings.personIdsWithMailing(db, day.id, 'proofs');
      const fresh = people.filter((person) => !mailed.has(person.id)).map((person) => person.id);
      const queued = await queueMail(viewer, day, 'proofs', fresh);
      // Those sent their proofs before hear of a moved deadline (the new ones read it in
      // theirs); each mail says the deadline as it is when it goes out.
      const moved =
        before !== undefined && before.picksCloseAt.getTime() !== picksCloseAt.getTime();
      const toldOfDate =
        moved && mailed.size > 0 ? await queueMail(viewer, day, 'proofs_deadline', [...mailed]) : 0;
      return {
        queued,
        alreadySent: mailed.size,
        toldOfNewDate: toldOfDate,
        picksCloseAt: picksCloseAt.toISOString(),
      };
    },

    async remind(viewer: Viewer, dayId: string) {
      const day = await visibleDay(viewer, dayId);
      const proofs = await repo.dayProofs(db, day.id);
      if (!proofs)
        throw new AppError('not_released', 409, 'The studio has not sent the proofs yet.');
      if (proofs.picksCloseAt.getTime() <= clock.now().getTime()) {
        throw new AppError('picks_closed', 409, 'The pick deadline has passed.');
      }
      const [people, picked] = await Promise.all([
        repo.peopleWithProofs(db, day.id),
        repo.pickedPersonIds(db, day.id),
      ]);
      const unpicked = people.filter((person) => !picked.has(person.id));
      // Under the day's lock, so a double click cannot find the same people due twice; anyone
      // reminded within the cool-down waits (as booking reminders do).
      return db.transaction().execute(async (trx) => {
        await lockDay(trx, day.id);
        const last = await mailings.lastRemindedAt(trx, day.id, 'proofs_reminder');
        const now = clock.now().getTime();
        const plan = splitByCooldown(
          unpicked.map((person) => person.id),
          last,
          now,
          cooldownMs,
        );
        const queued =
          plan.due.length > 0
            ? await queueMailWith(trx, viewer, day, 'proofs_reminder', plan.due)
            : 0;
        // Everyone just reminded waits out the cool-down too.
        const next =
          queued > 0
            ? Math.min(plan.nextAt?.getTime() ?? Infinity, now + cooldownMs)
            : plan.nextAt?.getTime();
        return {
          queued,
          coolingDown: plan.coolingDown,
          nextReminderAt: next === undefined ? null : new Date(next).toISOString(),
        };
      });
    },

    async progress(viewer: Viewer, dayId: string): Promise<ProofProgress> {
      const day = await visibleDay(viewer, dayId);
      const [proofs, people, picked, settings] = await Promise.all([
        repo.dayProofs(db, day.id),
        repo.peopleWithProofs(db, day.id),
        repo.pickedPersonIds(db, day.id),
        repo.proofSettings(db, day.clientId),
      ]);
      const pickedCount = people.filter((person) => picked.has(person.id)).length;
      return {
        released: proofs !== undefined,
        releasedAt: proofs?.releasedAt.toISOString() ?? null,
        picksCloseAt: proofs?.picksCloseAt.toISOString() ?? null,
        open: proofs !== undefined && proofs.picksCloseAt.getTime() > clock.now().getTime(),
        withProofs: people.length,
        picked: pickedCount,
        notPicked: people.length - pickedCount,
        settings,
      };
    },

    /** The studio's pick for a sitter: it stands if they do not choose by the deadline. */
    async setStudioPick(viewer: Viewer, dayId: string, personId: string, frameId: string) {
      const day = await findStudioDay(db, viewer, dayId);
      const frames = await repo.proofFramesOf(db, day.id, personId);
      if (!frames.some((frame) => frame.id === frameId)) {
        throw new AppError('invalid_input', 400, 'That frame is not one of this sitter’s proofs.');
      }
      await repo.saveStudioPick(db, {
        dayId: day.id,
        personId,
        frameId,
        chosenByUserId: viewer.id,
      });
      await recordAudit(db, {
        actorUserId: viewer.id,
        action: 'proofs.studio_pick_set',
        subjectType: 'frame',
        subjectId: frameId,
        details: { personId },
      });
      return { personId, frameId };
    },

    settle,

    handlers(): JobHandlers {
      return {
        [PROOF_MAIL_TASK]: async (payload, attempt) => {
          const mailingId = (payload as { mailingId?: unknown }).mailingId;
          if (typeof mailingId === 'string') await sendMail(mailingId, attempt.lastAttempt);
        },
        [SETTLE_PICKS_TASK]: async (payload) => {
          const dayId = (payload as { dayId?: unknown }).dayId;
          if (typeof dayId === 'string') await settle(dayId);
        },
      };
    },
  };
}
