import type { Db } from '../../db/database';
import { notFound } from '../../lib/errors';
import type { Viewer } from '../../lib/viewer';
import type { ClientProgress, DayProgress, DaySchedule, ProgressGroup } from '../../schemas/days';
import * as bookingRepo from '../booking/booking.repository';
import * as daysRepo from '../days/days.repository';
import type { DaysService } from '../days/days.service';
import { wallClockAt } from '../days/zoned-time';
import { toCsv } from '../../lib/csv';
import { recordedDay } from './day-record';

export type ProgressService = ReturnType<typeof createProgressService>;

function groupBy(
  people: daysRepo.InvitedPerson[],
  booked: Set<string>,
  key: (person: daysRepo.InvitedPerson) => string,
): ProgressGroup[] {
  const groups = new Map<string, ProgressGroup>();
  for (const person of people) {
    const label = key(person);
    const group = groups.get(label) ?? { label, invited: 0, booked: 0 };
    group.invited += 1;
    if (booked.has(person.id)) group.booked += 1;
    groups.set(label, group);
  }
  return [...groups.values()].sort((a, b) => a.label.localeCompare(b.label));
}

/** Adds each day's groups into the client's totals, label by label. */
function mergeGroups(totals: ProgressGroup[], groups: ProgressGroup[]) {
  for (const group of groups) {
    const total = totals.find((candidate) => candidate.label === group.label);
    if (total) {
      total.invited += group.invited;
      total.booked += group.booked;
    } else {
      totals.push({ ...group });
    }
  }
}

export function createProgressService(deps: { db: Db; days: DaysService }) {
  const { db, days } = deps;

  async function schedule(viewer: Viewer, dayId: string): Promise<DaySchedule> {
    const day = await days.visibleDay(viewer, dayId);
    const bookings = await bookingRepo.activeBookingsOfDay(db, dayId);
    return {
      dayId,
      clientName: day.clientName,
      officeName: day.officeName,
      date: day.date,
      timeZone: day.timeZone,
      address: day.address,
      room: day.room,
      stations: day.stations.map((station) => ({
        id: station.id,
        name: station.name,
        photographerName: station.photographerName,
        entries: bookings
          .filter((booking) => booking.stationId === station.id)
          .map((booking) => ({
            bookingId: booking.id,
            personId: booking.personId,
            startsAt: booking.startsAt.toISOString(),
            localTime: wallClockAt(booking.startsAt.getTime(), day.timeZone).time,
            name: booking.personName,
            preferredName: booking.preferredName,
            glasses: booking.glasses,
            flashSensitive: booking.flashSensitive,
            accessNeeds: booking.accessNeeds,
          })),
      })),
    };
  }

  async function dayProgress(viewer: Viewer, dayId: string): Promise<DayProgress> {
    const day = await days.visibleDay(viewer, dayId);
    const people = await daysRepo
      .invitedPeopleQuery(db, day)
      .orderBy('people.familyName')
      .execute();
    const bookings = await bookingRepo.activeBookingsOfDay(db, dayId);
    const booked = new Set(bookings.map((booking) => booking.personId));
    const bookedInvited = people.filter((person) => booked.has(person.id)).length;
    return {
      invited: people.length,
      booked: bookedInvited,
      unbooked: people.length - bookedInvited,
      byOffice: groupBy(people, booked, (person) => person.officeName ?? 'No office'),
      byDepartment: groupBy(people, booked, (person) => person.department ?? 'No department'),
      unbookedPeople: people.filter((person) => !booked.has(person.id)),
    };
  }

  return {
    schedule,
    progress: dayProgress,
    /** The day sheet after the day: what the console recorded, station by station. */
    recorded: (viewer: Viewer, dayId: string) => recordedDay({ db, days }, viewer, dayId),

    /** Every day of one client side by side: a coordinator's overview across offices. */
    async clientProgress(viewer: Viewer, clientId: string): Promise<ClientProgress> {
      if (viewer.role === 'coordinator' && viewer.clientId !== clientId) {
        throw notFound('That client');
      }
      const list = (await days.list(viewer)).filter((day) => day.clientId === clientId);
      const rows = [];
      const byOffice: ProgressGroup[] = [];
      const byDepartment: ProgressGroup[] = [];
      for (const day of list) {
        const progress = await dayProgress(viewer, day.id);
        mergeGroups(byOffice, progress.byOffice);
        mergeGroups(byDepartment, progress.byDepartment);
        rows.push({
          dayId: day.id,
          label: `${day.officeName} · ${day.date}`,
          status: day.status,
          invited: progress.invited,
          booked: progress.booked,
        });
      }
      return {
        clientId,
        invited: rows.reduce((sum, row) => sum + row.invited, 0),
        booked: rows.reduce((sum, row) => sum + row.booked, 0),
        days: rows,
        byOffice: byOffice.sort((a, b) => a.label.localeCompare(b.label)),
        byDepartment: byDepartment.sort((a, b) => a.label.localeCompare(b.label)),
      };
    },

    /** The schedule as CSV: RFC 4180 quoting and OWASP formula neutralising (shared helper). */
    async scheduleCsv(viewer: Viewer, dayId: string): Promise<{ name: string; csv: string }> {
      const sheet = await schedule(viewer, dayId);
      const rows: string[][] = [
        [
          'Date',
          'Local time',
          'Time zone',
          'Station',
          'Name',
          'Name for files',
          'Glasses',
          'Flash sensitive',
          'Access needs',
        ],
      ];
      const entries = sheet.stations
        .flatMap((station) => station.entries.map((entry) => ({ station: station.name, entry })))
        .sort(
          (a, b) =>
            a.entry.startsAt.localeCompare(b.entry.startsAt) || a.station.localeCompare(b.station),
        );
      for (const { station, entry } of entries) {
        rows.push([
          sheet.date,
          entry.localTime,
          sheet.timeZone,
          station,
          entry.name,
          entry.preferredName ?? '',
          entry.glasses ? 'yes' : 'no',
          entry.flashSensitive ? 'yes: use continuous light' : 'no',
          entry.accessNeeds ?? '',
        ]);
      }
      const slug = `${sheet.officeName}-${sheet.date}`.toLowerCase().replace(/[^a-z0-9]+/g, '-');
      return { name: `schedule-${slug}.csv`, csv: toCsv(rows) };
    },
  };
}
