import { z } from 'zod';
import { uuidSchema } from './common';

const instant = z.iso.datetime({ offset: true, error: 'Pick a slot.' });

/** What helps on the day; asked at booking, shown on the station's day sheet. */
export const sittingNeedsSchema = z.object({
  preferredName: z
    .string()
    .trim()
    .max(80, { error: 'Use at most 80 characters.' })
    .transform((value) => value || null)
    .nullable()
    .default(null),
  glasses: z.boolean().default(false),
  accessNeeds: z
    .string()
    .trim()
    .max(500, { error: 'Use at most 500 characters.' })
    .transform((value) => value || null)
    .nullable()
    .default(null),
  flashSensitive: z.boolean().default(false),
});

export type SittingNeedsRequest = z.input<typeof sittingNeedsSchema>;
export type SittingNeedsInput = z.output<typeof sittingNeedsSchema>;

export const createBookingRequestSchema = sittingNeedsSchema.extend({
  dayId: uuidSchema,
  startsAt: instant,
  /** Only coordinators and the studio book for someone else; a sitter's own id comes from the session. */
  personId: uuidSchema.optional(),
  /** Staff may seat the person at a chosen station; without it any free station is taken. */
  stationId: uuidSchema.optional(),
});
export type CreateBookingRequest = z.input<typeof createBookingRequestSchema>;
export type CreateBookingInput = z.output<typeof createBookingRequestSchema>;

export const moveBookingRequestSchema = z.object({ startsAt: instant });
export type MoveBookingRequest = z.infer<typeof moveBookingRequestSchema>;

export interface Booking {
  id: string;
  dayId: string;
  personId: string;
  personName: string;
  stationName: string;
  startsAt: string;
  localTime: string;
  localDate: string;
  offset: string;
  timeZone: string;
  status: 'active' | 'cancelled';
  sequence: number;
  preferredName: string | null;
  glasses: boolean;
  accessNeeds: string | null;
  flashSensitive: boolean;
  canChange: boolean;
}

export interface SitterDay {
  id: string;
  clientName: string;
  officeName: string;
  date: string;
  timeZone: string;
  address: string;
  room: string;
  bookingOpensAt: string;
  bookingClosesAt: string;
  changesCloseAt: string;
  bookingOpen: boolean;
  booking: Booking | null;
}
export type SitterDayList = { days: SitterDay[] };
