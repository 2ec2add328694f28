import { randomUUID } from 'node:crypto';
import { mkdtemp, rm, writeFile } from 'node:fs/promises';
import os from 'node:os';
import path from 'node:path';
import type { ObjectStorage } from '../../server/adapters/storage/storage';
import type { Db } from '../../server/db/database';
import type { Viewer } from '../../server/lib/viewer';
import { wallClockAt, zonedTimeToInstant } from '../../server/modules/days/zoned-time';
import { newPassToken } from '../../server/modules/booking/pass';
import { createFramesService } from '../../server/modules/frames/frames.service';
// The generated camera card the tests use: invented camera, DCF names, slates as QR codes.
import { cardFileBytes, planCard } from '../../tests/support/shoot-day-card';

/**
 * A day that has already been photographed, so the half of the product after the shutter can be
 * tried on a fresh start: Aldermoor Housing Trust's York staff sat yesterday at one station, the
 * console recorded their sittings, and the card is uploaded through the same path the upload
 * page uses. The worker then reads the frames and matches them; the studio goes on from the
 * review screen (proofs, picks, retouch, look, delivery). The frames are plain generated images
 * with slates, not portraits, so the eyes of every final are marked by hand on the set grid.
 */
export async function loadDemoPhotographedDay(deps: {
  db: Db;
  storage: ObjectStorage;
  limits: { maxBytes: number; maxPixels: number };
  now: Date;
}): Promise<{ dayId: string; frames: number } | null> {
  const { db } = deps;
  const client = await db
    .selectFrom('clients')
    .innerJoin('offices', 'offices.clientId', 'clients.id')
    .select(['clients.id as clientId', 'offices.id as officeId'])
    .where('clients.slug', '=', 'aldermoor-housing-trust')
    .where('offices.name', '=', 'York')
    .executeTakeFirst();
  const photographer = await db
    .selectFrom('users')
    .select(['id', 'email', 'displayName', 'role'])
    .where('email', '=', 'tomas@northlight.example')
    .executeTakeFirst();
  if (!client || !photographer) return null;
  const people = await db
    .selectFrom('people')
    .select(['id'])
    .where('clientId', '=', client.clientId)
    .orderBy('employeeId')
    .execute();

  const zone = 'Europe/London';
  const yesterday = wallClockAt(deps.now.getTime() - 24 * 3_600_000, zone).date;
  const at = (time: string) => new Date(zonedTimeToInstant(yesterday, time, zone));
  const plan = planCard({
    firstSittingAt: at('10:00'),
    sittings: people.length,
    framesPerSitting: 4,
    clockOffsetMs: 3 * 60_000 + 12_000, // the camera runs a little fast, as cameras do
    firstNumber: 412,
    serial: 'CV-58213',
    // Upright 2:3 frames, as a camera held for a portrait gives: with the hand marks where they
    // start, every preset rendition fits without enlarging the photo (tests/server/days-demo).
    frame: { width: 1600, height: 2400 },
  });

  const { dayId, stationId } = await db.transaction().execute(async (trx) => {
    const day = await trx
      .insertInto('shootDays')
      .values({
        clientId: client.clientId,
        officeId: client.officeId,
        dayDate: yesterday,
        timeZone: zone,
        address: '5 Osterby Row, York',
        room: 'Meeting room 1',
        opensAt: '09:30',
        closesAt: '12:00',
        breaks: '[]',
        slotMinutes: 5,
        bookingOpensAt: new Date(at('09:00').getTime() - 7 * 24 * 3_600_000),
        bookingClosesAt: at('09:00'),
        changesCloseAt: at('09:00'),
        inviteBy: 'office',
        inviteDepartments: '[]',
        status: 'confirmed',
        createdByUserId: null,
      })
      .returning('id')
      .executeTakeFirstOrThrow();
    const station = await trx
      .insertInto('stations')
      .values({ dayId: day.id, position: 1, name: 'Station A', photographerId: photographer.id })
      .returning('id')
      .executeTakeFirstOrThrow();
    for (const sitting of plan.sittings) {
      const personId = people[sitting.index]!.id;
      // As the day went: each sitter was invited (the mail sent a week before), booked the slot
      // they sat in and was checked in by their pass, so every page's figures agree.
      const invitedAt = new Date(at('09:00').getTime() - 7 * 24 * 3_600_000);
      await trx
        .insertInto('dayMailings')
        .values({
          dayId: day.id,
          personId,
          kind: 'invitation',
          status: 'sent',
          queuedAt: invitedAt,
          sentAt: invitedAt,
        })
        .execute();
      const booking = await trx
        .insertInto('bookings')
        .values({
          dayId: day.id,
          stationId: station.id,
          personId,
          startsAt: sitting.startedAt,
          passToken: newPassToken(),
          calendarUid: `${randomUUID()}@likeness`,
        })
        .returning('id')
        .executeTakeFirstOrThrow();
      const checkIn = await trx
        .insertInto('checkIns')
        .values({
          id: randomUUID(),
          dayId: day.id,
          personId,
          bookingId: booking.id,
          stationId: station.id,
          method: 'pass',
          checkedInAt: sitting.startedAt,
          tabletAt: sitting.startedAt,
        })
        .returning('id')
        .executeTakeFirstOrThrow();
      await trx
        .insertInto('sittings')
        .values({
          id: randomUUID(),
          dayId: day.id,
          stationId: station.id,
          personId,
          checkInId: checkIn.id,
          slateToken: sitting.slateToken,
          firstFrame: sitting.firstFrame,
          lastFrame: sitting.lastFrame,
          startedAt: sitting.startedAt,
          tabletStartedAt: sitting.startedAt,
          finishedAt: sitting.finishedAt,
          tabletFinishedAt: sitting.finishedAt,
        })
        .execute();
    }
    return { dayId: day.id, stationId: station.id };
  });

  // The card goes in as the upload page sends it: each file screened, stored and queued for reading.
  const frames = createFramesService({ db, storage: deps.storage, limits: deps.limits });
  const viewer: Viewer = {
    kind: 'staff',
    id: photographer.id,
    role: photographer.role,
    email: photographer.email,
    displayName: photographer.displayName,
    clientId: null,
    sessionId: 'demo-loader',
    sessionExpiresAt: new Date(Date.now() + 60_000),
  };
  const folder = await mkdtemp(path.join(os.tmpdir(), 'likeness-demo-card-'));
  try {
    for (const file of plan.files) {
      const bytes = await cardFileBytes(file);
      const uploadId = await frames.startUpload(viewer, {
        metadata: { dayId, stationId, cardPath: file.cardPath },
        declaredSize: bytes.length,
      });
      const filePath = path.join(folder, uploadId);
      await writeFile(filePath, bytes);
      await frames.finishUpload(uploadId, filePath);
    }
  } finally {
    await rm(folder, { recursive: true, force: true });
  }
  return { dayId, frames: plan.files.length };
}
