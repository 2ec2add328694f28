import type { Clock } from '../../adapters/clock';
import type { Mailer } from '../../adapters/mail/mailer';
import type { AppConfig } from '../../config';
import type { Db } from '../../db/database';
import * as daysRepo from '../days/days.repository';
import type { DayRecord } from '../days/days.repository';
import { bookingMail } from './booking.mails';
import * as repo from './booking.repository';
import type { BookingRecord } from './booking.repository';
import { writeIcs, type SittingEvent } from './ics';
import { passPng } from './pass';

export type BookingMailKind = 'booked' | 'moved' | 'updated' | 'cancelled' | 'day_before';

/**
 * Sends a sitter the message for their booking as it stands now: the pass as an inline PNG
 * and the calendar invitation (REQUEST with the current SEQUENCE, or CANCEL).
 */
export function createBookingMailSender(deps: {
  db: Db;
  clock: Clock;
  mailer: Mailer;
  config: AppConfig;
}) {
  const { db, clock, mailer, config } = deps;
  // With a reply address the invitation is a REQUEST whose organiser can receive answers;
  // without one it is PUBLISH, which asks for no reply.
  const invitationMethod = config.mailReplyTo ? 'REQUEST' : 'PUBLISH';

  return async function sendMail(kind: BookingMailKind, bookingId: string): Promise<void> {
    const booking = await repo.findBooking(db, bookingId);
    const day = booking ? await daysRepo.findDay(db, booking.dayId) : undefined;
    if (!booking || !day) return;
    // A later cancel already replaced this message: do not announce a sitting that is gone.
    if (kind !== 'cancelled' && booking.status === 'cancelled') return;
    const ics = sittingCalendar(
      booking,
      day,
      config,
      clock.now(),
      kind === 'cancelled' ? 'CANCEL' : invitationMethod,
    );
    await mailer.send(
      bookingMail({
        kind,
        to: booking.personEmail,
        name: booking.preferredName ?? booking.personName,
        day,
        startsAt: booking.startsAt,
        passPng: kind === 'cancelled' ? null : await passPng(booking.passToken),
        ics,
        calendarMethod: kind === 'cancelled' ? 'CANCEL' : invitationMethod,
        url: `${config.publicUrl}/`,
      }),
    );
  };
}

/**
 * The calendar entry of a sitting as it stands, organised by the studio (at its reply address
 * when there is one). Also served as a download from the sitter's page (PUBLISH).
 */
export function sittingCalendar(
  booking: BookingRecord,
  day: DayRecord,
  config: AppConfig,
  stampedAt: Date,
  method: SittingEvent['method'],
): string {
  return writeIcs({
    method,
    uid: booking.calendarUid,
    sequence: booking.sequence,
    stampedAt,
    startsAt: booking.startsAt,
    endsAt: new Date(booking.startsAt.getTime() + day.slotMinutes * 60_000),
    timeZone: day.timeZone,
    summary: `Portrait sitting (${day.clientName})`,
    location: day.room ? `${day.room}, ${day.address}` : day.address,
    description: sittingDescription(booking.stationName, day.room),
    organizer: { name: config.mailFrom.name, email: config.mailReplyTo ?? config.mailFrom.address },
    attendee: { name: booking.personName, email: booking.personEmail },
  });
}

/** The calendar entry's note: where to go and what to bring, in the sitter's words. */
export function sittingDescription(stationName: string, room: string | null): string {
  const where = room ? `${stationName} in ${room}` : stationName;
  return `Your portrait is taken at ${where}. Bring your pass (in the booking e-mail or on your booking page) and show it at the station.`;
}
