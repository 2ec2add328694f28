import type { Clock } from '../../adapters/clock';
import type { Mailer } from '../../adapters/mail/mailer';
import type { AppConfig } from '../../config';
import type { Db } from '../../db/database';
import { addJob, type JobHandlers } from '../../jobs/job-queue';
import { AppError, notFound } from '../../lib/errors';
import type { Logger } from '../../lib/logger';
import type { Viewer } from '../../lib/viewer';
import type { Booking, SitterDay, SittingNeedsInput } from '../../schemas/booking';
import type { SlotList } from '../../schemas/days';
import * as daysRepo from '../days/days.repository';
import { hoursOf, staffMaySee } from '../days/days.service';
import { generateSlots } from '../days/slots';
import { formatOffset, offsetMinutesAt, wallClockAt } from '../days/zoned-time';
import * as repo from './booking.repository';
import { createBookingClaims, readBookingDay } from './booking-claim';
import { createBookingMailSender, sittingCalendar } from './booking.confirmation';
import { checkSlot, conflict, recheckUnderLock, slotBegun } from './booking-checks';
import { passPng } from './pass';

const alreadyCheckedIn = () =>
  new AppError(
    'already_checked_in',
    409,
    'This sitter has already checked in at the station, so the booking can no longer be moved or cancelled.',
  );

export type BookingService = ReturnType<typeof createBookingService>;
export const bookingMailJob = 'booking-mail';

const isUniqueViolation = (error: unknown) =>
  typeof error === 'object' && error !== null && (error as { code?: unknown }).code === '23505';

export function createBookingService(deps: {
  db: Db;
  clock: Clock;
  mailer: Mailer;
  config: AppConfig;
  logger: Logger;
}) {
  const { db, clock, mailer, config } = deps;

  async function isInvited(day: daysRepo.DayRecord, personId: string): Promise<boolean> {
    const row = await daysRepo
      .invitedPeopleQuery(db, day)
      .where('people.id', '=', personId)
      .executeTakeFirst();
    return row !== undefined;
  }

  /** A day as a sitter may see it: confirmed and inviting them; anything else is 404. */
  const sitterDay = (viewer: Viewer, dayId: string) => readBookingDay(db, viewer, dayId, viewer.id);

  async function dayFor(viewer: Viewer, dayId: string): Promise<daysRepo.DayRecord> {
    if (viewer.role === 'sitter') return sitterDay(viewer, dayId);
    const day = await daysRepo.findDay(db, dayId);
    if (!day || !staffMaySee(viewer, day)) throw notFound('That shoot day');
    return day;
  }

  /** A booking the viewer may act on: their own as a sitter, their client's as a coordinator. */
  async function visibleBooking(viewer: Viewer, id: string) {
    const booking = await repo.findBooking(db, id);
    if (!booking) throw notFound('That booking');
    const day = await daysRepo.findDay(db, booking.dayId);
    if (!day) throw notFound('That booking');
    const allowed =
      viewer.role === 'sitter' ? booking.personId === viewer.id : staffMaySee(viewer, day);
    if (!allowed) throw notFound('That booking');
    return { booking, day };
  }

  function toDto(booking: repo.BookingRecord, day: daysRepo.DayRecord, viewer: Viewer): Booking {
    const wall = wallClockAt(booking.startsAt.getTime(), day.timeZone);
    return {
      id: booking.id,
      dayId: booking.dayId,
      personId: booking.personId,
      personName: booking.personName,
      stationName: booking.stationName,
      startsAt: booking.startsAt.toISOString(),
      localTime: wall.time,
      localDate: wall.date,
      offset: formatOffset(offsetMinutesAt(booking.startsAt.getTime(), day.timeZone)),
      timeZone: day.timeZone,
      status: booking.status,
      sequence: booking.sequence,
      preferredName: booking.preferredName,
      glasses: booking.glasses,
      accessNeeds: booking.accessNeeds,
      flashSensitive: booking.flashSensitive,
      canChange: booking.status === 'active' && !booking.checkedIn && mayChange(viewer, day),
    };
  }

  /** Sitters change until the cut-off; the studio and coordinators until the day is over. */
  function mayChange(viewer: Viewer, day: daysRepo.DayRecord): boolean {
    const now = clock.now();
    if (viewer.role === 'sitter') return now < day.changesCloseAt;
    const slots = generateSlots(hoursOf(day));
    const last = slots.at(-1);
    return last ? now.getTime() < Date.parse(last.endsAt) : false;
  }

  const sendMail = createBookingMailSender({ db, clock, mailer, config });

  return {
    sendMail,

    /** Confirmation mail is a job written in the booking's own transaction (an outbox). */
    handlers(): JobHandlers {
      return {
        [bookingMailJob]: async (payload) => {
          const { bookingId, kind } = payload as { bookingId?: unknown; kind?: unknown };
          if (typeof bookingId !== 'string') return;
          if (kind === 'booked' || kind === 'moved' || kind === 'updated' || kind === 'cancelled') {
            await sendMail(kind, bookingId);
          }
        },
      };
    },

    async sitterDays(viewer: Viewer): Promise<SitterDay[]> {
      if (!viewer.clientId) return [];
      const ids = await repo.confirmedDaysOfClient(db, viewer.clientId);
      const days = await daysRepo.listDays(db, { dayIds: ids });
      const now = clock.now();
      const result: SitterDay[] = [];
      for (const day of days) {
        if (!(await isInvited(day, viewer.id))) continue;
        const booking = await repo.activeBookingOf(db, day.id, viewer.id);
        result.push({
          id: day.id,
          clientName: day.clientName,
          officeName: day.officeName,
          date: day.date,
          timeZone: day.timeZone,
          address: day.address,
          room: day.room,
          bookingOpensAt: day.bookingOpensAt.toISOString(),
          bookingClosesAt: day.bookingClosesAt.toISOString(),
          changesCloseAt: day.changesCloseAt.toISOString(),
          bookingOpen: now >= day.bookingOpensAt && now < day.bookingClosesAt,
          booking: booking ? toDto(booking, day, viewer) : null,
        });
      }
      return result;
    },

    async slots(viewer: Viewer, dayId: string): Promise<SlotList> {
      const day = await dayFor(viewer, dayId);
      const taken = await repo.takenStationsByStart(db, dayId);
      const now = clock.now().getTime();
      const staff = viewer.role !== 'sitter';
      return {
        timeZone: day.timeZone,
        stations: day.stations.map((station) => ({ id: station.id, name: station.name })),
        // A slot that has begun cannot be booked by anyone, so nobody is offered one.
        slots: generateSlots(hoursOf(day))
          .filter((slot) => Date.parse(slot.startsAt) > now)
          .map((slot) => {
            const busy = taken.get(slot.startsAt);
            const free = day.stations.filter((station) => !busy?.has(station.id));
            return {
              ...slot,
              free: free.length,
              ...(staff ? { freeStationIds: free.map((station) => station.id) } : {}),
            };
          }),
      };
    },

    /** A seat claimed for a sitter (booking-claim.ts: the hot path of a booking burst). */
    create: createBookingClaims({ db, clock, mailTask: bookingMailJob, toDto }),

    async move(viewer: Viewer, id: string, startsAtText: string): Promise<Booking> {
      const { day } = await visibleBooking(viewer, id);
      if (!mayChange(viewer, day)) {
        throw conflict(
          'changes_closed',
          'Changes are closed for this day: contact your coordinator.',
        );
      }
      const startsAt = new Date(startsAtText);
      checkSlot(hoursOf(day), startsAt);
      if (startsAt <= clock.now()) throw slotBegun(day, startsAt);
      try {
        await db.transaction().execute(async (trx) => {
          await recheckUnderLock(trx, day.id, startsAt);
          const locked = await repo.lockBooking(trx, id);
          if (locked?.status !== 'active')
            throw conflict('booking_cancelled', 'That booking was cancelled.');
          const current = await repo.findBooking(trx, id);
          if (current?.checkedIn) throw alreadyCheckedIn();
          if (current?.startsAt.getTime() === startsAt.getTime()) return;
          const [stationId] = await repo.freeStationsAt(trx, day.id, startsAt);
          if (!stationId) throw conflict('slot_taken', 'That slot is full. Please pick another.');
          await repo.moveBooking(trx, id, stationId, startsAt, clock.now());
          // Two moves before the worker runs send one mail, about where the booking is now.
          await addJob(
            trx,
            bookingMailJob,
            { bookingId: id, kind: 'moved' },
            { jobKey: `${bookingMailJob}:moved:${id}` },
          );
        });
      } catch (error) {
        // Another sitter took the seat between our read and our write: the index refused it.
        if (isUniqueViolation(error)) {
          throw conflict('slot_taken', 'That slot has just been taken. Please pick another.');
        }
        throw error;
      }
      const booking = await repo.findBooking(db, id);
      if (!booking) throw notFound('That booking');
      return toDto(booking, day, viewer);
    },

    async cancel(viewer: Viewer, id: string): Promise<Booking> {
      const { day } = await visibleBooking(viewer, id);
      if (!mayChange(viewer, day)) {
        throw conflict(
          'changes_closed',
          'Changes are closed for this day: contact your coordinator.',
        );
      }
      await db.transaction().execute(async (trx) => {
        const locked = await repo.lockBooking(trx, id);
        if (locked?.status !== 'active') return;
        if ((await repo.findBooking(trx, id))?.checkedIn) throw alreadyCheckedIn();
        await repo.cancelBooking(trx, id, clock.now());
        await addJob(trx, bookingMailJob, { bookingId: id, kind: 'cancelled' });
      });
      const booking = await repo.findBooking(db, id);
      if (!booking) throw notFound('That booking');
      return toDto(booking, day, viewer);
    },

    /** The answers given at booking, changed until the sitter checks in (they help the day). */
    async updateNeeds(viewer: Viewer, id: string, needs: SittingNeedsInput): Promise<Booking> {
      const { day } = await visibleBooking(viewer, id);
      await db.transaction().execute(async (trx) => {
        const locked = await repo.lockBooking(trx, id);
        if (locked?.status !== 'active') {
          throw conflict('booking_cancelled', 'That booking was cancelled.');
        }
        if ((await repo.findBooking(trx, id))?.checkedIn) throw alreadyCheckedIn();
        await repo.updateSittingNeeds(trx, id, needs, clock.now());
      });
      const booking = await repo.findBooking(db, id);
      if (!booking) throw notFound('That booking');
      return toDto(booking, day, viewer);
    },

    /** The sitting as a calendar file to download (PUBLISH: it asks for no reply). */
    async calendarFile(viewer: Viewer, id: string): Promise<string> {
      const { booking, day } = await visibleBooking(viewer, id);
      if (booking.status !== 'active') throw notFound('That booking');
      return sittingCalendar(booking, day, config, clock.now(), 'PUBLISH');
    },

    async pass(viewer: Viewer, id: string): Promise<Buffer> {
      const { booking } = await visibleBooking(viewer, id);
      if (booking.status !== 'active') throw notFound('That pass');
      return passPng(booking.passToken);
    },
  };
}
