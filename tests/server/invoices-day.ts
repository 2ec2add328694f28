import { randomUUID } from 'node:crypto';
import { sql } from 'kysely';
import type { Db } from '../../server/db/database';
import type { PriceList } from '../../server/schemas/invoices';
import { insertClient, insertOffice, insertPerson, insertStaff } from '../factories/accounts';
import { insertDay } from '../factories/days';
import { insertBooking } from './console-support';

/** The price list the tests set, in pence: see the hand-worked invoice in invoices.test.ts. */
export const testPrices: PriceList = {
  currency: 'GBP',
  dayRateMinor: 95_000,
  perStationMinor: 12_500,
  perPersonMinor: 1_850,
  perExtraPickMinor: 1_200,
  perRetouchMinor: 2_250,
  perExtraRenditionMinor: 298,
  renditionsIncluded: 2,
  taxRateBasisPoints: 1_750,
};

const at = (time: string) => new Date(`2030-03-14T${time}:00Z`);

/**
 * A generated day with every kind of record, and the truth about it:
 * - Leeds invites its active people A–F (an inactive one is not invited);
 * - A, B, C and D booked, E booked and cancelled, F never booked;
 * - A and B checked in with their pass; C checked in and was undone; D is a no-show; C's
 *   no-show was marked and undone;
 * - walk-ins: Y from the York office (on the roster, not invited) and W, added to the roster
 *   at the station that day (so not invited either);
 * - sittings: A twice (a re-shoot), B once plus an undone one, Y and W once;
 * - picks (package: 1 included): A three (2 extra), B one, Y one; finals for A's first and Y's;
 * - renditions delivered: A three, Y one (2 included per person: 1 extra).
 */
export async function generateInvoiceDay(db: Db, options: { clientName?: string } = {}) {
  const client = await insertClient(db, options.clientName ? { name: options.clientName } : {});
  const leeds = await insertOffice(db, client.id, 'Leeds');
  const york = await insertOffice(db, client.id, 'York');
  const photographers = [
    await insertStaff(db, { role: 'photographer' }),
    await insertStaff(db, { role: 'photographer' }),
  ];
  const day = await insertDay(db, {
    clientId: client.id,
    officeId: leeds.id,
    photographerIds: photographers.map((photographer) => photographer.id),
  });
  const one = day.stations[0]!;
  const two = day.stations[1]!;
  await db
    .insertInto('clientProofSettings')
    .values({ clientId: client.id, picksIncluded: 1, extraPicksAllowed: 2 })
    .execute();
  const person = (givenName: string, officeId: string, active = true) =>
    insertPerson(db, client.id, { givenName, officeId, active }).then((row) => row.id);
  const [a, b, c, d, e] = await Promise.all(
    ['Ada', 'Bram', 'Cleo', 'Dov', 'Esme'].map((name) => person(name, leeds.id)),
  );
  await person('Finn', leeds.id); // invited, never booked
  await person('Ina', leeds.id, false);
  const y = await person('Yusuf', york.id);
  const w = await person('Wren', leeds.id);
  await db.updateTable('people').set({ addedOnDayId: day.id }).where('id', '=', w).execute();

  const booking = (personId: string, stationId: string, time: string, cancelled = false) =>
    insertBooking(db, {
      dayId: day.id,
      stationId,
      personId,
      startsAt: at(time),
      ...(cancelled ? { status: 'cancelled' as const } : {}),
    }).then((row) => row.id);
  const bookings = {
    a: await booking(a!, one.id, '09:00'),
    b: await booking(b!, two.id, '09:00'),
    c: await booking(c!, one.id, '09:05'),
    d: await booking(d!, two.id, '09:05'),
  };
  await booking(e!, one.id, '09:10', true);

  const checkIn = async (
    personId: string,
    stationId: string,
    method: 'pass' | 'search' | 'walk_in' | 'new_person',
    bookingId: string | null,
    undone = false,
  ) => {
    const id = randomUUID();
    await db
      .insertInto('checkIns')
      .values({
        id,
        dayId: day.id,
        personId,
        bookingId,
        stationId,
        method,
        checkedInAt: at('09:00'),
        tabletAt: at('09:00'),
        undoneAt: undone ? at('09:01') : null,
      })
      .execute();
    return id;
  };
  const checkIns = {
    a: await checkIn(a!, one.id, 'pass', bookings.a),
    b: await checkIn(b!, two.id, 'pass', bookings.b),
    y: await checkIn(y, one.id, 'walk_in', null),
    w: await checkIn(w, two.id, 'new_person', null),
  };
  await checkIn(c!, one.id, 'search', bookings.c, true);

  const noShow = (bookingId: string, stationId: string, undone: boolean) =>
    db
      .insertInto('noShows')
      .values({
        id: randomUUID(),
        dayId: day.id,
        bookingId,
        stationId,
        markedAt: at('09:20'),
        tabletAt: at('09:20'),
        undoneAt: undone ? at('09:21') : null,
      })
      .execute();
  await noShow(bookings.d, two.id, false);
  await noShow(bookings.c, one.id, true);

  let frameNumber = 100;
  const sitting = (personId: string, stationId: string, checkInId: string, undone = false) =>
    db
      .insertInto('sittings')
      .values({
        id: randomUUID(),
        dayId: day.id,
        stationId,
        personId,
        checkInId,
        slateToken: randomUUID(),
        firstFrame: (frameNumber += 10),
        lastFrame: frameNumber + 5,
        startedAt: at('09:30'),
        tabletStartedAt: at('09:30'),
        finishedAt: at('09:35'),
        tabletFinishedAt: at('09:35'),
        undoneAt: undone ? at('09:36') : null,
      })
      .execute();
  await sitting(a!, one.id, checkIns.a);
  await sitting(a!, one.id, checkIns.a);
  await sitting(b!, two.id, checkIns.b, true);
  await sitting(b!, two.id, checkIns.b);
  await sitting(y, one.id, checkIns.y);
  await sitting(w, two.id, checkIns.w);

  const pick = async (personId: string, stationId: string, position: number, final = false) => {
    const frameId = randomUUID();
    await db
      .insertInto('frames')
      .values({
        id: frameId,
        dayId: day.id,
        stationId,
        cardPath: `DCIM/100CANON/IMG_${frameId.slice(0, 4)}.JPG`,
        contentSha256: frameId.replace(/-/g, '').padEnd(64, '0'),
        byteSize: 1000,
        format: 'jpeg',
        originalKey: `originals/${frameId}.jpg`,
      })
      .execute();
    const id = randomUUID();
    await db
      .insertInto('picks')
      .values({
        id,
        dayId: day.id,
        personId,
        frameId,
        chosenBy: 'sitter',
        position,
        ...(final ? { finalKey: `finals/${id}.jpg`, retouchStatus: 'done' as const } : {}),
      })
      .execute();
    return id;
  };
  const picks = {
    a: [await pick(a!, one.id, 1, true), await pick(a!, one.id, 2), await pick(a!, one.id, 3)],
    b: await pick(b!, two.id, 1),
    y: await pick(y, one.id, 1, true),
  };

  // The delivery feature's tables (migration 2026-12-10T1000), written as it writes them.
  const deliveryId = randomUUID();
  await sql`insert into deliveries (id, day_id, release, files, changed)
    values (${deliveryId}, ${day.id}, 1, 4, 4)`.execute(db);
  const renditions: Array<[string, string, string]> = [
    [a!, picks.a[0]!, 'web'],
    [a!, picks.a[0]!, 'print'],
    [a!, picks.a[0]!, 'square'],
    [y, picks.y, 'web'],
  ];
  for (const [personId, pickId, name] of renditions) {
    await sql`insert into delivered_renditions
      (id, day_id, delivery_id, person_id, pick_id, rendition_name, file_name, key, byte_size, sha256, changed)
      values (${randomUUID()}, ${day.id}, ${deliveryId}, ${personId}, ${pickId}, ${name},
        ${`${personId}-${name}.jpg`}, ${`delivery/${personId}-${name}.jpg`}, 1000, ${'0'.repeat(64)}, true)`.execute(
      db,
    );
  }
  return { client, day, photographers };
}
