import type { Db } from '../../db/database';
import { recordAudit } from '../../lib/audit';
import { AppError, notFound } from '../../lib/errors';
import type { Viewer } from '../../lib/viewer';
import type { ConfirmDayRequest, CreateDayInput, Day } from '../../schemas/days';
import { dayTimesProblem } from './day-rules';
import * as repo from './days.repository';
import { generateSlots, type DayHours } from './slots';

export type DaysService = ReturnType<typeof createDaysService>;

export const hoursOf = (day: repo.DayRecord): DayHours => ({
  date: day.date,
  timeZone: day.timeZone,
  opensAt: day.opensAt,
  closesAt: day.closesAt,
  breaks: day.breaks,
  slotMinutes: day.slotMinutes,
});

/** Whether a staff member may see a day: studio admins all, others only their own. */
export function staffMaySee(viewer: Viewer, day: repo.DayRecord): boolean {
  if (viewer.role === 'studio_admin') return true;
  if (viewer.role === 'coordinator') return viewer.clientId === day.clientId;
  if (viewer.role === 'photographer') {
    return day.stations.some((station) => station.photographerId === viewer.id);
  }
  return false;
}

export function toDayDto(day: repo.DayRecord, booked: number): Day {
  const { reminderRounds: _reminderRounds, ...rest } = day;
  return {
    ...rest,
    bookingOpensAt: day.bookingOpensAt.toISOString(),
    bookingClosesAt: day.bookingClosesAt.toISOString(),
    changesCloseAt: day.changesCloseAt.toISOString(),
    seats: generateSlots(hoursOf(day)).length * day.stations.length,
    booked,
  };
}

export const fieldError = (field: string, message: string, status = 400) =>
  new AppError('invalid_input', status, message, { fieldErrors: { [field]: [message] } });

export function createDaysService(deps: { db: Db }) {
  const { db } = deps;

  /** A day the viewer may see; any other id answers 404, the same as a missing one. */
  async function visibleDay(viewer: Viewer, id: string): Promise<repo.DayRecord> {
    const day = await repo.findDay(db, id);
    if (!day || !staffMaySee(viewer, day)) throw notFound('That shoot day');
    return day;
  }

  return {
    visibleDay,

    async list(viewer: Viewer): Promise<Day[]> {
      const days = await repo.listDays(db, {
        clientId: viewer.role === 'coordinator' ? viewer.clientId : null,
        photographerId: viewer.role === 'photographer' ? viewer.id : null,
      });
      const booked = await repo.bookedCounts(
        db,
        days.map((day) => day.id),
      );
      return days.map((day) => toDayDto(day, booked.get(day.id) ?? 0));
    },

    async get(viewer: Viewer, id: string): Promise<Day> {
      const day = await visibleDay(viewer, id);
      const booked = await repo.bookedCounts(db, [id]);
      return toDayDto(day, booked.get(id) ?? 0);
    },

    async create(viewer: Viewer, input: CreateDayInput): Promise<Day> {
      // A coordinator proposes for their own client only, and the studio staffs the stations.
      const proposing = viewer.role === 'coordinator';
      if (proposing && viewer.clientId !== input.clientId) throw notFound('That client');
      const timeZone = await repo.officeTimeZone(db, input.officeId, input.clientId);
      if (!timeZone) throw fieldError('officeId', 'Pick an office of this client.');
      const stations = input.stations.map((station) => ({
        ...station,
        photographerId: proposing ? null : station.photographerId,
      }));
      if (!proposing) {
        const wanted = stations.map((station) => station.photographerId ?? '');
        if (wanted.some((id) => id === '')) {
          throw fieldError('stations', 'Assign a photographer to every station.');
        }
        const known = await repo.activePhotographerIds(db, wanted);
        if (wanted.some((id) => !known.has(id))) {
          throw fieldError('stations', 'Pick active photographers of the studio.');
        }
      }
      if (input.inviteBy === 'list') {
        const found = await repo.peopleOfClient(db, input.clientId, input.invitePersonIds);
        if (found.length !== new Set(input.invitePersonIds).size) {
          throw fieldError('invitePersonIds', 'Pick people from this client’s roster.');
        }
      }
      const problem = dayTimesProblem({ ...input, timeZone }, input);
      if (problem) throw fieldError(problem.field, problem.message);
      const id = await db.transaction().execute(async (trx) => {
        const dayId = await repo.insertDay(
          trx,
          { ...input, stations, timeZone, status: proposing ? 'proposed' : 'confirmed' },
          viewer.id,
        );
        await recordAudit(trx, {
          actorUserId: viewer.id,
          action: proposing ? 'day.proposed' : 'day.created',
          subjectType: 'shoot_day',
          subjectId: dayId,
        });
        return dayId;
      });
      return this.get(viewer, id);
    },

    /** The studio staffs a proposed day's stations and confirms it. */
    async confirm(viewer: Viewer, id: string, input: ConfirmDayRequest): Promise<Day> {
      const day = await visibleDay(viewer, id);
      const stationIds = new Set(day.stations.map((station) => station.id));
      const given = new Set(input.stations.map((station) => station.id));
      if (given.size !== stationIds.size || [...given].some((sid) => !stationIds.has(sid))) {
        throw fieldError('stations', 'Assign a photographer to every station of the day.');
      }
      const known = await repo.activePhotographerIds(
        db,
        input.stations.map((station) => station.photographerId),
      );
      if (input.stations.some((station) => !known.has(station.photographerId))) {
        throw fieldError('stations', 'Pick active photographers of the studio.');
      }
      await db.transaction().execute(async (trx) => {
        await repo.lockDay(trx, id);
        await repo.assignPhotographers(trx, id, input.stations);
        await recordAudit(trx, {
          actorUserId: viewer.id,
          action: 'day.confirmed',
          subjectType: 'shoot_day',
          subjectId: id,
        });
      });
      return this.get(viewer, id);
    },
  };
}
