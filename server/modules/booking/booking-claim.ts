import { randomUUID } from 'node:crypto';
import type { Clock } from '../../adapters/clock';
import type { Db } from '../../db/database';
import { AppError, notFound } from '../../lib/errors';
import type { Viewer } from '../../lib/viewer';
import type { Booking, CreateBookingInput } from '../../schemas/booking';
import * as daysRepo from '../days/days.repository';
import { hoursOf, staffMaySee } from '../days/days.service';
import * as repo from './booking.repository';
import { checkSlot, conflict, slotBegun } from './booking-checks';
import { newPassToken } from './pass';
import { createRecentDays } from './recent-days';

type BookingDay = daysRepo.DayRecord & { version: string };
type Claimed = { booking: Booking; created: boolean };

/**
 * A day as the viewer may book this person on it, read now: a sitter sees only a confirmed day
 * that invites them, staff a day they may see (and book only people it invites); else 404.
 */
export async function readBookingDay(
  db: Db,
  viewer: Viewer,
  dayId: string,
  personId: string,
): Promise<BookingDay> {
  const day = await daysRepo.findDayForPerson(db, dayId, personId);
  if (viewer.role === 'sitter') {
    if (!day || day.status !== 'confirmed' || !day.invited) throw notFound('That shoot day');
  } else {
    if (!day || !staffMaySee(viewer, day)) throw notFound('That shoot day');
    if (day.status === 'confirmed' && !day.invited) throw notFound('That person');
  }
  return day;
}

/**
 * Claiming a seat. A sitter's claim on a day this process has read lately costs two round
 * trips (the session, then one statement that checks and books): the remembered day answers
 * the request's own checks, and the statement books only if the day row is still the version
 * those checks saw. Anything else — a day changed meanwhile, a check that fails, a claim from
 * staff — is decided on the day read afresh, so no answer rests on a stale copy.
 */
export function createBookingClaims(deps: {
  db: Db;
  clock: Clock;
  mailTask: string;
  toDto: (booking: repo.BookingRecord, day: daysRepo.DayRecord, viewer: Viewer) => Booking;
}) {
  const { db, clock } = deps;
  const recentDays = createRecentDays<BookingDay>();

  /** The request's checks on a day, in the order their answers should come; the slot's time. */
  function checkRequest(viewer: Viewer, input: CreateBookingInput, day: BookingDay): Date {
    if (day.status !== 'confirmed')
      throw conflict('day_not_confirmed', 'This day is not confirmed yet.');
    const now = clock.now();
    if (viewer.role === 'sitter' && (now < day.bookingOpensAt || now >= day.bookingClosesAt)) {
      throw conflict('booking_closed', 'Booking for this day is not open right now.');
    }
    const startsAt = new Date(input.startsAt);
    checkSlot(hoursOf(day), startsAt);
    if (startsAt <= now) throw slotBegun(day, startsAt);
    if (input.stationId && viewer.role === 'sitter') {
      throw new AppError('invalid_input', 400, 'The studio places sitters at stations.', {
        fieldErrors: { stationId: ['Leave the station to the studio.'] },
      });
    }
    if (input.stationId && !day.stations.some((station) => station.id === input.stationId)) {
      throw new AppError('invalid_input', 400, 'That station is not one of this day’s.', {
        fieldErrors: { stationId: ['Pick one of the day’s stations.'] },
      });
    }
    return startsAt;
  }

  /** Claims on one version of the day; 'stale' when the row moved on, 'no_person' as it says. */
  async function claimOn(
    viewer: Viewer,
    input: CreateBookingInput,
    personId: string,
    day: BookingDay,
    startsAt: Date,
  ): Promise<Claimed | 'stale' | 'no_person'> {
    // Each try is one statement with a fresh view: a lost race on one seat tries another.
    for (let attempt = 0; attempt <= day.stations.length; attempt += 1) {
      const claim = await repo.claimBooking(db, {
        dayId: day.id,
        clientId: day.clientId,
        dayVersion: day.version,
        personId,
        startsAt,
        passToken: newPassToken(),
        calendarUid: `${randomUUID()}@likeness`,
        preferredName: input.preferredName,
        glasses: input.glasses,
        accessNeeds: input.accessNeeds,
        flashSensitive: input.flashSensitive,
        bookedByUserId: viewer.kind === 'staff' ? viewer.id : null,
        stationId: input.stationId ?? null,
        mailTask: deps.mailTask,
      });
      if (claim.kind === 'booked') {
        return { booking: deps.toDto(claim.booking, day, viewer), created: true };
      }
      if (claim.kind === 'day_changed') return 'stale';
      if (claim.kind === 'no_person') return 'no_person';
      if (claim.kind === 'has_booking') {
        // A second click on the same slot is the same booking, not an error.
        if (claim.startsAt.getTime() !== startsAt.getTime()) {
          throw conflict('already_booked', 'You already have a slot that day: move it instead.');
        }
        const booking = await repo.findBooking(db, claim.bookingId);
        if (!booking) throw notFound('That booking');
        return { booking: deps.toDto(booking, day, viewer), created: false };
      }
      if (claim.kind === 'full') break;
      // seat_lost: another claim took the seat, or this person's own double click landed
      // first (the one-per-sitter index refused the second); the next try sees which.
    }
    throw input.stationId
      ? conflict('station_taken', 'That station is taken at that time: pick another.')
      : conflict('slot_taken', 'That slot has just been taken. Please pick another.');
  }

  /** The day as it is now, with the viewer's right to book this person on it. */
  async function freshDay(viewer: Viewer, dayId: string, personId: string): Promise<BookingDay> {
    const day = await readBookingDay(db, viewer, dayId, personId);
    recentDays.remember(day);
    return day;
  }

  /** The claim on a remembered day: its answer, or null to decide on the day read afresh. */
  async function onRememberedDay(
    viewer: Viewer,
    input: CreateBookingInput,
  ): Promise<Claimed | null> {
    const day = recentDays.get(input.dayId);
    if (!day) return null;
    let startsAt: Date;
    try {
      startsAt = checkRequest(viewer, input, day);
    } catch {
      return null;
    }
    const outcome = await claimOn(viewer, input, viewer.id, day, startsAt);
    if (typeof outcome === 'string') {
      recentDays.forget(day.id);
      return null;
    }
    return outcome;
  }

  return async function create(viewer: Viewer, input: CreateBookingInput): Promise<Claimed> {
    const personId = viewer.role === 'sitter' ? viewer.id : input.personId;
    if (!personId) {
      throw new AppError('invalid_input', 400, 'Say who the booking is for.', {
        fieldErrors: { personId: ['Pick the person to book.'] },
      });
    }
    if (viewer.role === 'sitter') {
      const quick = await onRememberedDay(viewer, input);
      if (quick) return quick;
    }
    // A day edited between the read and the claim is read again (an edit is rare and short).
    for (let attempt = 0; attempt < 3; attempt += 1) {
      const day = await freshDay(viewer, input.dayId, personId);
      const startsAt = checkRequest(viewer, input, day);
      const outcome = await claimOn(viewer, input, personId, day, startsAt);
      if (outcome === 'no_person') throw notFound('That person');
      if (outcome !== 'stale') return outcome;
    }
    throw conflict(
      'day_changed',
      'The studio is changing this day just now: look at its slots again and pick one.',
    );
  };
}
