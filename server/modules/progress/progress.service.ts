import type { Db } from '../../db/database';
import { notFound } from '../../lib/errors';
import type { Viewer } from '../../lib/viewer';
import type { ClientProgress, DayProgress, DaySchedule, ProgressGroup } from '../../schemas/days';
import {
  addCounts,
  addPerson,
  emptyCounts,
  groupPeople,
  mergeGroups,
  type PersonOnDay,
} from './progress-counts';
import * as progressRepo from './progress.repository';
import * as bookingRepo from '../booking/booking.repository';
import * as daysRepo from '../days/days.repository';
import type { DaysService } from '../days/days.service';
import { wallClockAt } from '../days/zoned-time';
import { toCsv } from '../../lib/csv';
import { NO_FLASH_WORDING } from '../../schemas/sitter-wording';
import { recordedDay } from './day-record';

async function invitationsSent(db: Db, dayId: string): Promise<Set<string>> {
  const rows = await db
    .selectFrom('dayMailings')
    .select('personId')
    .where('dayId', '=', dayId)
    .where('kind', '=', 'invitation')
    .where('status', '=', 'sent')
    .execute();
  return new Set(rows.map((row) => row.personId));
}

export type ProgressService = ReturnType<typeof createProgressService>;

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
    const holdsBooking = new Set(bookings.map((booking) => booking.personId));
    const outcome = await progressRepo.consoleOutcomes(db, dayId);
    const invitedIds = new Set(people.map((person) => person.id));
    const walkIns = await progressRepo.placesOf(
      db,
      [...outcome.checkedIn].filter((id) => !invitedIds.has(id)),
    );
    // "Invited" means mailed: a queued or failed invitation has not reached anyone yet.
    const mailed = await invitationsSent(db, dayId);
    const onDay = (
      person: { id: string; officeName: string | null; department: string | null },
      listed: boolean,
    ): PersonOnDay => {
      const checkedIn = outcome.checkedIn.has(person.id);
      // A no-show undone by a late check-in is not a no-show.
      const noShow = outcome.noShow.has(person.id) && !checkedIn;
      return {
        id: person.id,
        officeName: person.officeName,
        department: person.department,
        invited: listed && mailed.has(person.id),
        booked: holdsBooking.has(person.id) && !noShow,
        checkedIn,
        photographed: outcome.photographed.has(person.id),
        noShow,
      };
    };
    const everyone = [
      ...people.map((person) => onDay(person, true)),
      ...walkIns.map((person) => onDay(person, false)),
    ];
    const counts = emptyCounts();
    everyone.forEach((person) => addPerson(counts, person));
    const unbookedPeople = people.filter((person) => !holdsBooking.has(person.id));
    return {
      ...counts,
      listed: people.length,
      unbooked: unbookedPeople.length,
      byOffice: groupPeople(everyone, (person) => person.officeName ?? 'No office'),
      byDepartment: groupPeople(everyone, (person) => person.department ?? 'No department'),
      unbookedPeople,
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
      const rows: ClientProgress['days'] = [];
      const byOffice: ProgressGroup[] = [];
      const byDepartment: ProgressGroup[] = [];
      const totals = emptyCounts();
      for (const day of list) {
        const {
          byOffice: offices,
          byDepartment: departments,
          ...progress
        } = await dayProgress(viewer, day.id);
        mergeGroups(byOffice, offices);
        mergeGroups(byDepartment, departments);
        const counts = {
          invited: progress.invited,
          booked: progress.booked,
          checkedIn: progress.checkedIn,
          photographed: progress.photographed,
          noShow: progress.noShow,
        };
        addCounts(totals, counts);
        rows.push({
          dayId: day.id,
          label: `${day.officeName} · ${day.date}`,
          status: day.status,
          ...counts,
        });
      }
      return {
        clientId,
        ...totals,
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
          entry.flashSensitive ? `yes: ${NO_FLASH_WORDING}` : 'no',
          entry.accessNeeds ?? '',
        ]);
      }
      const slug = `${sheet.officeName}-${sheet.date}`.toLowerCase().replace(/[^a-z0-9]+/g, '-');
      return { name: `schedule-${slug}.csv`, csv: toCsv(rows) };
    },
  };
}
