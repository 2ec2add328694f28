import type { Db } from '../../db/database';
import { recordAudit } from '../../lib/audit';
import { AppError, notFound } from '../../lib/errors';
import type { Viewer } from '../../lib/viewer';
import { setupCardSchema, type DaySetupCards, type SetupCard } from '../../schemas/setup-card';
import { findStudioDay } from '../days/studio-day-access';
import * as repo from './setup-cards.repository';

export type SetupCardsService = ReturnType<typeof createSetupCardsService>;

/** Setup cards belong to the studio: its admin, and the photographers working that day. */
export function createSetupCardsService(deps: { db: Db }) {
  const { db } = deps;

  const assertDayAccess = (viewer: Viewer, dayId: string) => findStudioDay(db, viewer, dayId);

  async function stationFor(viewer: Viewer, stationId: string) {
    const station = await repo.findStation(db, stationId);
    if (!station) throw notFound('That station');
    await assertDayAccess(viewer, station.dayId);
    return station;
  }

  return {
    async forDay(viewer: Viewer, dayId: string): Promise<DaySetupCards> {
      const day = await assertDayAccess(viewer, dayId);
      return {
        dayId: day.id,
        dayDate: day.date,
        clientName: day.clientName,
        officeName: day.officeName,
        address: day.address,
        room: day.room,
        stations: await repo.listStationCards(db, dayId),
      };
    },

    async save(viewer: Viewer, stationId: string, card: SetupCard): Promise<void> {
      const station = await stationFor(viewer, stationId);
      await repo.upsertCard(db, station.id, card, viewer.id);
      await recordAudit(db, {
        actorUserId: viewer.id,
        action: 'setup_card.saved',
        subjectType: 'station',
        subjectId: station.id,
      });
    },

    async copy(viewer: Viewer, stationId: string, fromStationId: string): Promise<void> {
      if (stationId === fromStationId)
        throw new AppError('same_station', 409, 'Choose another station to copy from.');
      const target = await stationFor(viewer, stationId);
      const source = await stationFor(viewer, fromStationId);
      // A stored card is checked again: the schema may have grown stricter since it was saved.
      const parsed = setupCardSchema.safeParse(source.card);
      if (!parsed.success)
        throw new AppError('no_card', 409, 'That station has no setup card to copy yet.');
      await repo.upsertCard(db, target.id, parsed.data, viewer.id);
      await recordAudit(db, {
        actorUserId: viewer.id,
        action: 'setup_card.copied',
        subjectType: 'station',
        subjectId: target.id,
        details: { fromStationId },
      });
    },

    sources: (viewer: Viewer) =>
      repo.listCardSources(db, viewer.role === 'photographer' ? viewer.id : null),
  };
}
