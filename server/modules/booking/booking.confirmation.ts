import type { Clock } from '../../adapters/clock';
import type { Mailer } from '../../adapters/mail/mailer';
import type { AppConfig } from '../../config';
import type { Db } from '../../db/database';
import * as daysRepo from '../days/days.repository';
import { bookingMail } from './booking.mails';
import * as repo from './booking.repository';
import { writeIcs } from './ics';
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
  const organizerEmail = /<([^>]+)>/.exec(config.mailFrom)?.[1] ?? config.mailFrom;

  return async function sendMail(kind: BookingMailKind, bookingId: string): Promise<void> {
    const booking = await repo.findBooking(db, bookingId);
    const day = booking ? await daysRepo.findDay(db, booking.dayId) : undefined;
    if (!booking || !day) return;
    // A later cancel already replaced this message: do not announce a sitting that is gone.
    if (kind !== 'cancelled' && booking.status === 'cancelled') return;
    const endsAt = new Date(booking.startsAt.getTime() + day.slotMinutes * 60_000);
    const ics = writeIcs({
      method: kind === 'cancelled' ? 'CANCEL' : 'REQUEST',
      uid: booking.calendarUid,
      sequence: booking.sequence,
      stampedAt: clock.now(),
      startsAt: booking.startsAt,
      endsAt,
      timeZone: day.timeZone,
      summary: `Portrait sitting (${day.clientName})`,
      location: day.room ? `${day.room}, ${day.address}` : day.address,
      description: `Station ${booking.stationName}. Show your pass at the station.`,
      organizer: { name: 'Likeness bookings', email: organizerEmail },
      attendee: { name: booking.personName, email: booking.personEmail },
    });
    await mailer.send(
      bookingMail({
        kind,
        to: booking.personEmail,
        name: booking.preferredName ?? booking.personName,
        day,
        startsAt: booking.startsAt,
        passPng: kind === 'cancelled' ? null : await passPng(booking.passToken),
        ics,
        url: `${config.publicUrl}/`,
      }),
    );
  };
}
