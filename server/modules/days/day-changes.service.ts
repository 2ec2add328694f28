import type { Clock } from '../../adapters/clock';
import type { Db } from '../../db/database';
import { addJob } from '../../jobs/job-queue';
import { recordAudit } from '../../lib/audit';
import { AppError, notFound } from '../../lib/errors';
import type { Viewer } from '../../lib/viewer';
import type {
  DayChangePreview,
  DayChangeProposal,
  DayChangeResult,
  DayChanges,
} from '../../schemas/day-changes';
import * as bookingRepo from '../booking/booking.repository';
import { bookingMailJob } from '../booking/booking.service';
import { planDayChange, type DayChangePlan } from './day-change-plan';
import * as repo from './day-changes.repository';
import { dayTimesProblem } from './day-rules';
import * as daysRepo from './days.repository';
import { fieldError, hoursOf, staffMaySee, toDayDto } from './days.service';
import { generateSlots } from './slots';

export type DayChangesService = ReturnType<typeof createDayChangesService>;
type Executor = Parameters<typeof daysRepo.findDay>[0];

const conflict = (code: string, message: string, details?: Record<string, unknown>) =>
  new AppError(code, 409, message, details);

export function createDayChangesService(deps: { db: Db; clock: Clock }) {
  const { db, clock } = deps;

  async function visibleDay(executor: Executor, viewer: Viewer, dayId: string) {
    const day = await daysRepo.findDay(executor, dayId);
    if (!day || !staffMaySee(viewer, day)) throw notFound('That shoot day');
    return day;
  }

  function ensureChangeable(day: daysRepo.DayRecord) {
    if (day.status === 'cancelled') throw conflict('day_cancelled', 'This day is cancelled.');
    const last = generateSlots(hoursOf(day)).at(-1);
    if (!last || Date.parse(last.endsAt) <= clock.now().getTime()) {
      throw conflict('day_over', 'This day is over: it can no longer be changed.');
    }
  }

  /**
   * Checks an edit against the day and works out what it does to the bookings. A coordinator's
   * edit keeps the photographers as they are (the studio staffs stations when it applies it).
   */
  async function plan(
    executor: Executor,
    viewer: Viewer,
    day: daysRepo.DayRecord,
    input: DayChanges,
  ): Promise<{ changes: DayChanges; plan: DayChangePlan; removed: string[] }> {
    ensureChangeable(day);
    const current = new Map(day.stations.map((station) => [station.id, station]));
    if (input.stations.some((station) => station.id && !current.has(station.id))) {
      throw fieldError('stations', 'A station listed is not one of this day’s.');
    }
    const staffing = viewer.role === 'studio_admin';
    const changes: DayChanges = {
      ...input,
      stations: input.stations.map((station) => ({
        ...station,
        photographerId: staffing
          ? station.photographerId
          : station.id
            ? (current.get(station.id)?.photographerId ?? null)
            : null,
      })),
    };
    if (staffing && day.status === 'confirmed') {
      const wanted = changes.stations.map((station) => station.photographerId ?? '');
      if (wanted.some((id) => id === '')) {
        throw fieldError('stations', 'Assign a photographer to every station.');
      }
      const known = await daysRepo.activePhotographerIds(executor, wanted);
      if (wanted.some((id) => !known.has(id))) {
        throw fieldError('stations', 'Pick active photographers of the studio.');
      }
    }
    const hours = { ...hoursOf(day), ...changes, date: changes.date };
    const problem = dayTimesProblem(hours, changes);
    if (problem) throw fieldError(problem.field, problem.message);

    const keptIds = new Set(changes.stations.flatMap((station) => station.id ?? []));
    const removed = day.stations.map((station) => station.id).filter((id) => !keptIds.has(id));
    const recorded = await repo.stationsWithHistory(executor, removed);
    if (recorded.size > 0) {
      const names = day.stations.filter((station) => recorded.has(station.id));
      throw conflict(
        'station_in_use',
        `${names.map((station) => station.name).join(', ')} already has check-ins or frames: keep it.`,
      );
    }
    const bookings = await bookingRepo.activeBookingsOfDay(executor, day.id);
    const seatsBefore = generateSlots(hoursOf(day)).length * day.stations.length;
    return {
      changes,
      removed,
      plan: planDayChange({
        before: { hours: hoursOf(day), seats: seatsBefore },
        after: {
          hours,
          stations: changes.stations.map((station, index) => ({
            key: station.id ?? `new:${index}`,
            name: station.name,
          })),
        },
        bookings: bookings.map((booking) => ({
          id: booking.id,
          personName: booking.personName,
          stationId: booking.stationId,
          stationName: booking.stationName,
          startsAt: booking.startsAt,
          checkedIn: booking.checkedIn,
        })),
        now: clock.now(),
        resolution: changes.resolution,
        placeChanged: changes.address !== day.address || changes.room !== day.room,
      }),
    };
  }

  /** Under the day's lock: a waiting proposal of this day, or 404. */
  async function waitingProposal(
    trx: Parameters<typeof repo.lockStations>[0],
    dayId: string,
    id: string,
  ) {
    const proposal = await repo.lockWaitingProposal(trx, dayId, id);
    if (!proposal) throw notFound('That proposal (it may have been decided already)');
    return proposal;
  }

  async function dayResult(viewer: Viewer, dayId: string, outcome: DayChangePreview) {
    const day = await visibleDay(db, viewer, dayId);
    const booked = await daysRepo.bookedCounts(db, [dayId]);
    return { day: toDayDto(day, booked.get(dayId) ?? 0), outcome };
  }

  return {
    /** What saving the edit would do; writes nothing. */
    async preview(viewer: Viewer, dayId: string, input: DayChanges): Promise<DayChangePreview> {
      const day = await visibleDay(db, viewer, dayId);
      return (await plan(db, viewer, day, input)).plan.preview;
    },

    /**
     * Saves an edit in one transaction: stations, hours and window, the bookings moved or
     * cancelled as planned under the lock, each sitter's mail queued with the change.
     */
    async apply(
      viewer: Viewer,
      dayId: string,
      input: DayChanges,
      proposalId?: string,
    ): Promise<DayChangeResult> {
      await visibleDay(db, viewer, dayId);
      const outcome = await db
        .transaction()
        .execute(async (trx) => {
          await daysRepo.lockDay(trx, dayId);
          await repo.lockStations(trx, dayId);
          const day = await visibleDay(trx, viewer, dayId);
          if (proposalId) await waitingProposal(trx, dayId, proposalId);
          const planned = await plan(trx, viewer, day, input);
          const { preview } = planned.plan;
          if (preview.blocked.length > 0) {
            throw conflict('edit_blocked', preview.blocked.join(' '), { blocked: preview.blocked });
          }
          const ids = await repo.saveStations(trx, dayId, planned.changes.stations);
          const stationOf = (key: string) =>
            key.startsWith('new:') ? (ids[Number(key.slice(4))] ?? '') : key;
          const now = clock.now();
          for (const move of planned.plan.moves) {
            await repo.rebookSeat(
              trx,
              move.bookingId,
              stationOf(move.stationKey),
              move.startsAt,
              now,
            );
            await addJob(
              trx,
              bookingMailJob,
              { bookingId: move.bookingId, kind: 'moved' },
              { jobKey: `${bookingMailJob}:moved:${move.bookingId}` },
            );
          }
          for (const bookingId of planned.plan.cancels) {
            await bookingRepo.cancelBooking(trx, bookingId, now);
            await addJob(trx, bookingMailJob, { bookingId, kind: 'cancelled' });
          }
          await repo.raiseSequence(trx, planned.plan.updates, now);
          for (const bookingId of planned.plan.updates) {
            await addJob(
              trx,
              bookingMailJob,
              { bookingId, kind: 'updated' },
              { jobKey: `${bookingMailJob}:moved:${bookingId}` },
            );
          }
          await repo.updateDayFields(trx, dayId, planned.changes);
          await repo.removeStations(trx, dayId, planned.removed, ids[0] ?? '');
          if (proposalId) await repo.decideProposal(trx, proposalId, 'applied', viewer.id, now);
          await recordAudit(trx, {
            actorUserId: viewer.id,
            action: 'day.edited',
            subjectType: 'shoot_day',
            subjectId: dayId,
            details: {
              moved: preview.moved.length,
              cancelled: preview.cancelled.length,
              updated: preview.updated,
              stationsRemoved: planned.removed.length,
              stationsAdded: planned.changes.stations.filter((station) => !station.id).length,
              proposalId: proposalId ?? null,
            },
          });
          await repo.notifyConsoles(trx, dayId);
          return preview;
        })
        .catch((error: unknown) => {
          // A seat taken between the plan and the write: the unique index refused it.
          if ((error as { code?: unknown }).code === '23505') {
            throw conflict('seat_taken', 'A seat was just taken: look at the changes again.');
          }
          throw error;
        });
      return dayResult(viewer, dayId, outcome);
    },

    /** Cancels the day and every booking on it, each sitter told with a calendar cancellation. */
    async cancelDay(
      viewer: Viewer,
      dayId: string,
      input: { reason: string; proposalId?: string | undefined },
    ): Promise<DayChangeResult> {
      await visibleDay(db, viewer, dayId);
      const outcome = await db.transaction().execute(async (trx) => {
        await daysRepo.lockDay(trx, dayId);
        const day = await visibleDay(trx, viewer, dayId);
        ensureChangeable(day);
        if (input.proposalId) await waitingProposal(trx, dayId, input.proposalId);
        const recorded = await repo.stationsWithHistory(
          trx,
          day.stations.map((station) => station.id),
        );
        if (recorded.size > 0) {
          throw conflict(
            'day_started',
            'Sitters have checked in on this day: it cannot be cancelled.',
          );
        }
        const bookings = await bookingRepo.activeBookingsOfDay(trx, dayId);
        const now = clock.now();
        for (const booking of bookings) {
          await bookingRepo.cancelBooking(trx, booking.id, now);
          await addJob(trx, bookingMailJob, { bookingId: booking.id, kind: 'cancelled' });
        }
        await repo.markDayCancelled(trx, dayId);
        if (input.proposalId) {
          await repo.decideProposal(trx, input.proposalId, 'applied', viewer.id, now);
        }
        await recordAudit(trx, {
          actorUserId: viewer.id,
          action: 'day.cancelled',
          subjectType: 'shoot_day',
          subjectId: dayId,
          // The reason is free text and may name people: the audit only notes that one was given.
          details: { bookingsCancelled: bookings.length, reasonGiven: input.reason !== '' },
        });
        await repo.notifyConsoles(trx, dayId);
        const seats = generateSlots(hoursOf(day)).length * day.stations.length;
        return {
          seatsBefore: seats,
          seatsAfter: 0,
          moved: [],
          cancelled: bookings.map((booking) => ({
            bookingId: booking.id,
            personName: booking.personName,
            from: { localTime: '', stationName: booking.stationName },
            to: null,
            reason: 'day_moved' as const,
          })),
          updated: 0,
          blocked: [],
        };
      });
      return dayResult(viewer, dayId, outcome);
    },

    /** A coordinator's change, stored for the studio; checked now so a bad one is refused early. */
    async propose(
      viewer: Viewer,
      dayId: string,
      input: { kind: 'edit'; changes: DayChanges; note: string } | { kind: 'cancel'; note: string },
    ): Promise<DayChangeProposal> {
      const day = await visibleDay(db, viewer, dayId);
      ensureChangeable(day);
      const changes =
        input.kind === 'edit' ? (await plan(db, viewer, day, input.changes)).changes : null;
      const id = await db.transaction().execute(async (trx) => {
        const proposalId = await repo.insertProposal(
          trx,
          { dayId, kind: input.kind, changes, note: input.note },
          viewer.id,
        );
        await recordAudit(trx, {
          actorUserId: viewer.id,
          action: 'day.change_proposed',
          subjectType: 'shoot_day',
          subjectId: dayId,
          details: { proposalId, kind: input.kind },
        });
        return proposalId;
      });
      const proposal = (await repo.listProposals(db, dayId)).find((item) => item.id === id);
      if (!proposal) throw notFound('That proposal');
      return proposal;
    },

    async proposals(viewer: Viewer, dayId: string): Promise<DayChangeProposal[]> {
      await visibleDay(db, viewer, dayId);
      return repo.listProposals(db, dayId);
    },

    async decline(viewer: Viewer, dayId: string, proposalId: string): Promise<DayChangeProposal[]> {
      await visibleDay(db, viewer, dayId);
      await db.transaction().execute(async (trx) => {
        await waitingProposal(trx, dayId, proposalId);
        await repo.decideProposal(trx, proposalId, 'declined', viewer.id, clock.now());
        await recordAudit(trx, {
          actorUserId: viewer.id,
          action: 'day.change_declined',
          subjectType: 'shoot_day',
          subjectId: dayId,
          details: { proposalId },
        });
      });
      return repo.listProposals(db, dayId);
    },
  };
}
