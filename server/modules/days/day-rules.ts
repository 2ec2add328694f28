import { generateSlots, type DayHours } from './slots';
import { zonedTimeToInstant } from './zoned-time';

/**
 * The checks a day's times must pass that need its zone (so they cannot live in the schema):
 * the hours leave at least one slot, and booking and changes close no later than the day does.
 * Returns the first problem as a field and a message, or null.
 */
export function dayTimesProblem(
  hours: DayHours,
  window: { bookingClosesAt: string | Date; changesCloseAt: string | Date },
): { field: string; message: string } | null {
  if (generateSlots(hours).length === 0) {
    return {
      field: 'closesAt',
      message: 'These hours leave no slot: open longer or shorten breaks.',
    };
  }
  const closes = zonedTimeToInstant(hours.date, hours.closesAt, hours.timeZone);
  if (new Date(window.bookingClosesAt).getTime() > closes) {
    return { field: 'bookingClosesAt', message: 'Booking must close by the end of the day.' };
  }
  if (new Date(window.changesCloseAt).getTime() > closes) {
    return { field: 'changesCloseAt', message: 'Changes must close by the end of the day.' };
  }
  return null;
}
