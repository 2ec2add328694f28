import type { Clock } from '../../adapters/clock';
import type { Db } from '../../db/database';
import { forbidden, notFound } from '../../lib/errors';
import type { Viewer } from '../../lib/viewer';
import type {
  ConsoleAction,
  ConsoleActionResult,
  ConsoleDay,
  ConsoleSnapshot,
  RosterMatch,
} from '../../schemas/console';
import { applyConsoleAction } from './console-actions';
import { buildQueue } from './console-snapshot';
import * as repo from './console.repository';

export type ConsoleService = ReturnType<typeof createConsoleService>;

/**
 * The station console: studio admins on any day, photographers on days they have a station
 * on, coordinators looking (never changing) at their own client's days.
 */
export function createConsoleService(deps: { db: Db; clock: Clock }) {
  const { db, clock } = deps;

  async function dayFor(viewer: Viewer, dayId: string, mode: 'view' | 'act') {
    const day = await repo.findDay(db, dayId);
    if (!day) throw notFound('That shoot day');
    if (viewer.role === 'coordinator') {
      // Another client's day does not exist as far as this coordinator can tell.
      if (viewer.clientId !== day.clientId) throw notFound('That shoot day');
      if (mode === 'act') throw forbidden('Coordinators can follow the console but not change it.');
    } else if (viewer.role === 'photographer') {
      if (!day.stations.some((station) => station.photographerId === viewer.id)) {
        throw forbidden('You are not assigned to this shoot day.');
      }
    } else if (viewer.role !== 'studio_admin') {
      throw forbidden();
    }
    return day;
  }

  return {
    dayFor,

    async days(viewer: Viewer): Promise<ConsoleDay[]> {
      const days = await repo.listDays(db, {
        photographerId: viewer.role === 'photographer' ? viewer.id : null,
        clientId: viewer.role === 'coordinator' ? viewer.clientId : null,
      });
      const stations = await repo.listStationsOfDays(
        db,
        days.map((day) => day.id),
      );
      return days.map((day) => ({
        ...day,
        stations: stations
          .filter((station) => station.dayId === day.id)
          .map((station) => ({
            id: station.id,
            name: station.name,
            position: station.position,
            photographerName: station.photographerName,
            mine: station.photographerId === viewer.id,
          })),
      }));
    },

    async snapshot(viewer: Viewer, dayId: string): Promise<ConsoleSnapshot> {
      const day = await dayFor(viewer, dayId, 'view');
      const [bookings, checkIns, sittings, noShows] = await Promise.all([
        repo.listBookings(db, dayId),
        repo.listCheckIns(db, dayId),
        repo.listSittings(db, dayId),
        repo.listNoShows(db, dayId),
      ]);
      const queue = buildQueue({ dayId, bookings, checkIns, sittings, noShows });
      return {
        day: {
          id: day.id,
          date: day.date,
          clientName: day.clientName,
          officeName: day.officeName,
          timeZone: day.timeZone,
          address: day.address,
          room: day.room,
          slotMinutes: day.slotMinutes,
          graceMinutes: day.graceMinutes,
        },
        stations: day.stations.map((station) => ({
          id: station.id,
          name: station.name,
          position: station.position,
          photographerName: station.photographerName,
        })),
        ...queue,
        serverTime: clock.now().toISOString(),
        canAct: viewer.role !== 'coordinator',
      };
    },

    async searchRoster(viewer: Viewer, dayId: string, text: string): Promise<RosterMatch[]> {
      const day = await dayFor(viewer, dayId, 'view');
      const rows = await repo.searchRoster(db, day.clientId, dayId, text);
      return rows.map((row) => ({
        id: row.id,
        name: `${row.givenName} ${row.familyName}${row.preferredName ? ` (${row.preferredName})` : ''}`,
        employeeId: row.employeeId,
        department: row.department,
        officeName: row.officeName,
        checkedIn: Boolean(row.checkedIn),
      }));
    },

    async act(viewer: Viewer, dayId: string, action: ConsoleAction): Promise<ConsoleActionResult> {
      const day = await dayFor(viewer, dayId, 'act');
      return applyConsoleAction({ db, clock }, viewer, day, action);
    },
  };
}
