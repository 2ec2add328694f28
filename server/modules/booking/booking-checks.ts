import type { Transaction } from 'kysely';
import type { Database } from '../../db/types';
import { AppError } from '../../lib/errors';
import * as daysRepo from '../days/days.repository';
import { isSlotStart, type DayHours } from '../days/slots';
import { wallClockAt } from '../days/zoned-time';

/** A refusal that names the clash (409), so the page can say what to do instead. */
export const conflict = (code: string, message: string) => new AppError(code, 409, message);

export function checkSlot(hours: DayHours, startsAt: Date) {
  if (!isSlotStart(hours, startsAt)) {
    throw new AppError('invalid_input', 400, 'That is not one of the day’s slots.', {
      fieldErrors: { startsAt: ['Pick one of the listed slots.'] },
    });
  }
}

/** Says when the slot began, in the day's own clock, so the refusal explains itself. */
export const slotBegun = (day: { timeZone: string }, startsAt: Date) =>
  new AppError(
    'slot_past',
    409,
    `That slot began at ${wallClockAt(startsAt.getTime(), day.timeZone).time} (${day.timeZone}): pick a later one.`,
  );

/**
 * The day as it stands once no edit can run (a shared lock on its row, which an edit locks for
 * update): still open for booking, and the time still one of its slots.
 */
export async function recheckUnderLock(trx: Transaction<Database>, dayId: string, startsAt: Date) {
  const hours = await daysRepo.lockDayHoursShared(trx, dayId);
  if (hours?.status !== 'confirmed') {
    throw new AppError('day_not_confirmed', 409, 'This day is not open for booking.');
  }
  checkSlot(hours, startsAt);
}
