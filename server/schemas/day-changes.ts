import { z } from 'zod';
import { controlCharacterPattern, uuidSchema } from './common';
import {
  breakSchema,
  clockTime,
  dayDate,
  instant,
  minutesOfClock,
  slotMinutesSchema,
  type Day,
} from './days';

const plainText = (max: number, message: string) =>
  z
    .string()
    .trim()
    .max(max, { error: message })
    .refine((value) => !controlCharacterPattern.test(value), {
      error: 'Remove control characters.',
    });

/** A station as edited: with the id of one the day has, or without an id to add one. */
export const editStationSchema = z.object({
  id: uuidSchema.optional(),
  name: plainText(60, 'Use at most 60 characters.').pipe(
    z.string().min(1, { error: 'Name the station.' }),
  ),
  photographerId: uuidSchema.nullable().default(null),
});

/** The day as it should be after the edit (a full replacement of what can change). */
export const dayChangesSchema = z
  .object({
    date: dayDate,
    address: plainText(300, 'Use at most 300 characters.').pipe(
      z.string().min(3, { error: 'Enter the address.' }),
    ),
    room: plainText(120, 'Use at most 120 characters.').default(''),
    opensAt: clockTime,
    closesAt: clockTime,
    breaks: z.array(breakSchema).max(6).default([]),
    slotMinutes: slotMinutesSchema,
    bookingOpensAt: instant,
    bookingClosesAt: instant,
    changesCloseAt: instant,
    stations: z
      .array(editStationSchema)
      .min(1, { error: 'Keep at least one station.' })
      .max(20, { error: 'Use at most 20 stations.' }),
    /** Bookings that no longer fit: moved to the nearest free seat, or cancelled. */
    resolution: z.enum(['move', 'cancel']).default('move'),
  })
  .superRefine((day, ctx) => {
    if (minutesOfClock(day.opensAt) >= minutesOfClock(day.closesAt)) {
      ctx.addIssue({ code: 'custom', path: ['closesAt'], message: 'Close after opening.' });
    }
    if (Date.parse(day.bookingOpensAt) >= Date.parse(day.bookingClosesAt)) {
      ctx.addIssue({
        code: 'custom',
        path: ['bookingClosesAt'],
        message: 'Booking closes after it opens.',
      });
    }
    const ids = day.stations.flatMap((station) => (station.id ? [station.id] : []));
    if (new Set(ids).size !== ids.length) {
      ctx.addIssue({ code: 'custom', path: ['stations'], message: 'A station is listed twice.' });
    }
  });
export type DayChangesRequest = z.input<typeof dayChangesSchema>;
export type DayChanges = z.output<typeof dayChangesSchema>;

/** The studio saves an edit; naming a proposal marks that proposal applied with it. */
export const editDayRequestSchema = z.object({
  changes: dayChangesSchema,
  proposalId: uuidSchema.optional(),
});
export type EditDayRequest = z.input<typeof editDayRequestSchema>;

export const cancelDayRequestSchema = z.object({
  reason: plainText(300, 'Use at most 300 characters.').default(''),
  proposalId: uuidSchema.optional(),
});
export type CancelDayRequest = z.input<typeof cancelDayRequestSchema>;

export const proposeDayChangeRequestSchema = z.discriminatedUnion('kind', [
  z.object({
    kind: z.literal('edit'),
    changes: dayChangesSchema,
    note: plainText(500, 'Use at most 500 characters.').default(''),
  }),
  z.object({
    kind: z.literal('cancel'),
    note: plainText(500, 'Use at most 500 characters.').default(''),
  }),
]);
export type ProposeDayChangeRequest = z.input<typeof proposeDayChangeRequestSchema>;

/** One booking the edit touches, as the studio sees it before and after saving. */
export interface AffectedBooking {
  bookingId: string;
  personName: string;
  from: { localTime: string; stationName: string };
  /** Where it moves; null when it is cancelled. */
  to: { localTime: string; stationName: string } | null;
  reason: 'station_removed' | 'outside_hours' | 'day_moved';
}

export interface DayChangePreview {
  seatsBefore: number;
  seatsAfter: number;
  moved: AffectedBooking[];
  cancelled: AffectedBooking[];
  /** Bookings that keep their seat but get a new invitation (the place or the date changed). */
  updated: number;
  /** Why the edit cannot be saved as it is (a sitting already begun or checked in). */
  blocked: string[];
}

export interface DayChangeResult {
  day: Day;
  outcome: DayChangePreview;
}

export interface DayChangeProposal {
  id: string;
  dayId: string;
  kind: 'edit' | 'cancel';
  changes: DayChanges | null;
  note: string;
  status: 'waiting' | 'applied' | 'declined';
  proposedBy: string | null;
  createdAt: string;
  decidedAt: string | null;
}
export type DayChangeProposalList = { proposals: DayChangeProposal[] };
