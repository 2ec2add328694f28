import { randomUUID } from 'node:crypto';
import { insertClient, insertOffice, insertPerson, insertStaff } from '../factories/accounts';
import { insertDay } from '../factories/days';
import { insertBooking } from '../server/console-support';
import type { TestApp } from '../setup/test-app';

/**
 * A finished Leeds day with two stations and what a console would have recorded: Aino booked
 * at A and photographed there (frames 101-120), Bram booked at A and a no-show, Carla a walk-in
 * photographed at A (121-130), Dries booked at A but photographed at B (5-9), Edda booked at A
 * with nothing recorded, and an undone check-in that must not count.
 */
export async function recordedDayScenario(t: TestApp) {
  const db = t.db;
  const client = await insertClient(db, { name: 'Halvorsen & Pike Engineering' });
  const office = await insertOffice(db, client.id, 'Leeds', 'Europe/London');
  const photographer = await insertStaff(db, { role: 'photographer' });
  const day = await insertDay(db, {
    clientId: client.id,
    officeId: office.id,
    photographerIds: [photographer.id, photographer.id],
    date: '2030-03-14',
  });
  const stationA = day.stations[0]!;
  const stationB = day.stations[1]!;
  const person = async (givenName: string) =>
    insertPerson(db, client.id, { officeId: office.id, givenName });
  const at = (time: string) => new Date(`2030-03-14T${time}:00Z`); // London is on GMT in March
  const [aino, bram, carla, dries, edda] = await Promise.all(
    ['Aino', 'Bram', 'Carla', 'Dries', 'Edda'].map(person),
  );
  const book = (personId: string, time: string, flashSensitive = false) =>
    insertBooking(db, {
      dayId: day.id,
      stationId: stationA.id,
      personId,
      startsAt: at(time),
      flashSensitive,
    });
  const ainoBooking = await book(aino!.id, '09:00', true);
  const bramBooking = await book(bram!.id, '09:05');
  const driesBooking = await book(dries!.id, '09:10');
  await book(edda!.id, '09:15');

  const checkIn = async (
    personId: string,
    stationId: string,
    time: string,
    bookingId: string | null,
    method: 'search' | 'walk_in',
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
        checkedInAt: at(time),
        tabletAt: at(time),
        byUserId: photographer.id,
        undoneAt: undone ? at(time) : null,
      })
      .execute();
    return id;
  };
  const sitting = async (
    personId: string,
    stationId: string,
    checkInId: string,
    time: string,
    firstFrame: number,
    lastFrame: number,
  ) =>
    db
      .insertInto('sittings')
      .values({
        id: randomUUID(),
        dayId: day.id,
        stationId,
        personId,
        checkInId,
        slateToken: randomUUID(),
        firstFrame,
        typedFirstFrame: firstFrame,
        lastFrame,
        typedLastFrame: lastFrame,
        startedAt: at(time),
        tabletStartedAt: at(time),
        startedByUserId: photographer.id,
        finishedAt: at(time),
        tabletFinishedAt: at(time),
        finishedByUserId: photographer.id,
      })
      .execute();

  const ainoIn = await checkIn(aino!.id, stationA.id, '08:58', ainoBooking.id, 'search');
  await sitting(aino!.id, stationA.id, ainoIn, '09:01', 101, 120);
  await db
    .insertInto('noShows')
    .values({
      id: randomUUID(),
      dayId: day.id,
      bookingId: bramBooking.id,
      stationId: stationA.id,
      markedAt: at('09:20'),
      tabletAt: at('09:20'),
      byUserId: photographer.id,
    })
    .execute();
  const carlaIn = await checkIn(carla!.id, stationA.id, '09:07', null, 'walk_in');
  await sitting(carla!.id, stationA.id, carlaIn, '09:08', 121, 130);
  const driesIn = await checkIn(dries!.id, stationB.id, '09:09', driesBooking.id, 'search');
  await sitting(dries!.id, stationB.id, driesIn, '09:10', 5, 9);
  // Edda was checked in by mistake and the check-in was undone: nothing recorded for her.
  await checkIn(edda!.id, stationA.id, '09:14', null, 'search', true);
  return { client, office, photographer, day, stationA, stationB };
}
