import type { Db } from '../../db/database';
import { forbidden, notFound } from '../../lib/errors';
import type { Viewer } from '../../lib/viewer';
import { findDay } from './days.repository';

/**
 * A day as the studio works it (setup cards, frames): the studio admin sees every day, a
 * photographer only the days with a station of theirs. Routes already allow studio roles only.
 */
export async function findStudioDay(db: Db, viewer: Viewer, dayId: string) {
  const day = await findDay(db, dayId);
  if (!day) throw notFound('That shoot day');
  const assigned = day.stations.some((station) => station.photographerId === viewer.id);
  if (viewer.role === 'photographer' && !assigned) {
    throw forbidden('You are not assigned to this shoot day.');
  }
  return day;
}

/**
 * A day as the studio or the client follows it (proofs, delivery, frame counts): the studio's
 * day rules above, or a coordinator's own client's day. Anything else is not found.
 */
export async function findFollowedDay(db: Db, viewer: Viewer, dayId: string) {
  if (viewer.role !== 'coordinator') return findStudioDay(db, viewer, dayId);
  const day = await findDay(db, dayId);
  if (!day || viewer.clientId !== day.clientId) throw notFound('That shoot day');
  return day;
}
