import { z } from 'zod';
import { uuidSchema } from './common';

export const clockTime = z
  .string({ error: 'Enter a time like 09:00.' })
  .regex(/^([01]\d|2[0-3]):[0-5]\d$/, { error: 'Enter a time like 09:00.' });
const minutesOf = (time: string) => Number(time.slice(0, 2)) * 60 + Number(time.slice(3, 5));
/**
 * Dates and instants inside a window a real shoot day can use: a typo such as 1900-01-01 or
 * 9999-12-31 is refused rather than stored (the service also refuses a new day in the past).
 */
export const earliestDayDate = '2000-01-01';
export const latestDayDate = '2099-12-31';
const inWindow = (date: string) => date >= earliestDayDate && date <= latestDayDate;
const windowMessage = 'Pick a date between 2000 and 2099.';
export const dayDate = z.iso
  .date({ error: 'Pick the date of the day.' })
  .refine((date) => !/^\d{4}-\d{2}-\d{2}$/.test(date) || inWindow(date), {
    error: windowMessage,
  });
export const instant = z.iso.datetime({ offset: true, error: 'Enter a date and time.' }).refine(
  (value) => {
    // A value that is not a date-time at all was already refused by the format check.
    const at = Date.parse(value);
    return Number.isNaN(at) || inWindow(new Date(at).toISOString().slice(0, 10));
  },
  { error: windowMessage },
);

/**
 * Slot lengths that divide the hour, so slots line up with the clock (common practice for
 * booking sheets). A number is required as a number: "0x0a" or "1e1" are not coerced.
 */
export const slotMinuteChoices = [3, 4, 5, 6, 10, 12, 15, 20, 30, 60] as const;
export const slotMinutesSchema = z
  .number({ error: 'Enter the slot length in minutes.' })
  .int({ error: 'Use whole minutes.' })
  .refine((value) => (slotMinuteChoices as readonly number[]).includes(value), {
    error: `Use one of ${slotMinuteChoices.join(', ')} minutes.`,
  });

export const minutesOfClock = minutesOf;

export const breakSchema = z
  .object({ start: clockTime, end: clockTime })
  .refine((pause) => minutesOf(pause.start) < minutesOf(pause.end), {
    error: 'A break ends after it starts.',
    path: ['end'],
  });

export const stationInputSchema = z.object({
  name: z.string().trim().min(1, { error: 'Name the station.' }).max(60),
  photographerId: uuidSchema.nullable().default(null),
});

export const createDayRequestSchema = z
  .object({
    clientId: uuidSchema,
    officeId: uuidSchema,
    date: dayDate,
    address: z.string().trim().min(3, { error: 'Enter the address.' }).max(300),
    room: z.string().trim().max(120).default(''),
    opensAt: clockTime,
    closesAt: clockTime,
    breaks: z.array(breakSchema).max(6).default([]),
    slotMinutes: slotMinutesSchema.default(5),
    bookingOpensAt: instant,
    bookingClosesAt: instant,
    changesCloseAt: instant,
    inviteBy: z.enum(['office', 'department', 'list']).default('office'),
    inviteDepartments: z.array(z.string().trim().min(1).max(120)).max(50).default([]),
    invitePersonIds: z.array(uuidSchema).max(5000).default([]),
    stations: z
      .array(stationInputSchema)
      .min(1, { error: 'Add at least one station.' })
      .max(20, { error: 'Use at most 20 stations.' }),
  })
  .superRefine((day, ctx) => {
    if (minutesOf(day.opensAt) >= minutesOf(day.closesAt)) {
      ctx.addIssue({ code: 'custom', path: ['closesAt'], message: 'Close after opening.' });
    }
    if (Date.parse(day.bookingOpensAt) >= Date.parse(day.bookingClosesAt)) {
      ctx.addIssue({
        code: 'custom',
        path: ['bookingClosesAt'],
        message: 'Booking closes after it opens.',
      });
    }
    if (day.inviteBy === 'department' && day.inviteDepartments.length === 0) {
      ctx.addIssue({ code: 'custom', path: ['inviteDepartments'], message: 'Name a department.' });
    }
    if (day.inviteBy === 'list' && day.invitePersonIds.length === 0) {
      ctx.addIssue({ code: 'custom', path: ['invitePersonIds'], message: 'Pick the people.' });
    }
  });
export type CreateDayRequest = z.input<typeof createDayRequestSchema>;
export type CreateDayInput = z.output<typeof createDayRequestSchema>;

export const confirmDayRequestSchema = z.object({
  stations: z.array(z.object({ id: uuidSchema, photographerId: uuidSchema })).min(1),
});
export type ConfirmDayRequest = z.infer<typeof confirmDayRequestSchema>;

export const stationSchema = z.object({
  id: z.string(),
  name: z.string(),
  photographerId: z.string().nullable(),
  photographerName: z.string().nullable(),
});

export const daySchema = z.object({
  id: z.string(),
  clientId: z.string(),
  clientName: z.string(),
  officeId: z.string(),
  officeName: z.string(),
  date: z.string(),
  timeZone: z.string(),
  address: z.string(),
  room: z.string(),
  opensAt: z.string(),
  closesAt: z.string(),
  breaks: z.array(z.object({ start: z.string(), end: z.string() })),
  slotMinutes: z.number(),
  bookingOpensAt: z.string(),
  bookingClosesAt: z.string(),
  changesCloseAt: z.string(),
  inviteBy: z.enum(['office', 'department', 'list']),
  inviteDepartments: z.array(z.string()),
  status: z.enum(['proposed', 'confirmed', 'cancelled']),
  stations: z.array(stationSchema),
  seats: z.number(),
  booked: z.number(),
});
export type Day = z.infer<typeof daySchema>;
export type DayList = { days: Day[] };

export const slotSchema = z.object({
  startsAt: z.string(),
  endsAt: z.string(),
  localTime: z.string(),
  offset: z.string(),
  free: z.number(),
  /** Staff only: the stations still free at this time, so a booking can name one. */
  freeStationIds: z.array(z.string()).optional(),
});
export type SlotWithSeats = z.infer<typeof slotSchema>;
export type SlotList = {
  timeZone: string;
  stations: Array<{ id: string; name: string }>;
  slots: SlotWithSeats[];
};

export const mailingKinds = [
  'invitation',
  'reminder',
  'day_before',
  'proofs',
  'proofs_reminder',
  'proofs_deadline',
  'portraits_ready',
] as const;
export type MailingKind = (typeof mailingKinds)[number];

export interface MailingLog {
  counts: { queued: number; sent: number; failed: number };
  entries: Array<{
    personId: string;
    name: string;
    email: string;
    kind: MailingKind;
    round: number;
    status: 'queued' | 'sent' | 'failed';
    reason: string | null;
    updatedAt: string;
    /** On a person's latest reminder: when the cool-down lets them have another. */
    nextReminderAt: string | null;
  }>;
  reminders: ReminderState;
}
/** One reminder per person and day within the cool-down; the panel shows what is possible. */
export interface ReminderState {
  cooldownHours: number;
  /** Booking has closed: there is nothing left to remind anyone to do. */
  bookingClosed: boolean;
  /** Unbooked people a reminder would go to now. */
  dueNow: number;
  /** Unbooked people reminded within the cool-down. */
  coolingDown: number;
  /** When the next of those becomes due again; null when none is waiting. */
  nextAt: string | null;
}
export interface QueuedMailings {
  queued: number;
  alreadyQueued: number;
  /** Reminders only: people skipped because they were reminded within the cool-down. */
  coolingDown?: number;
  nextReminderAt?: string | null;
}

/**
 * How far a group got on a day. booked: holds a booking not marked as a no-show; checkedIn and
 * photographed include walk-ins (who may not have been invited); noShow: booked, never came.
 */
export interface ProgressCounts {
  invited: number;
  booked: number;
  checkedIn: number;
  photographed: number;
  noShow: number;
}
export interface ProgressGroup extends ProgressCounts {
  label: string;
}
export interface DayProgress extends ProgressCounts {
  /** People the day's rule invites (its list); `invited` counts only those actually mailed. */
  listed: number;
  /** Listed people without a booking (no-shows did book, so they are not here). */
  unbooked: number;
  byOffice: ProgressGroup[];
  byDepartment: ProgressGroup[];
  unbookedPeople: Array<{
    id: string;
    name: string;
    email: string;
    department: string | null;
    officeName: string | null;
  }>;
}

export interface ScheduleEntry {
  bookingId: string;
  personId: string;
  startsAt: string;
  localTime: string;
  name: string;
  preferredName: string | null;
  glasses: boolean;
  flashSensitive: boolean;
  accessNeeds: string | null;
}
export interface DaySchedule {
  dayId: string;
  clientName: string;
  officeName: string;
  date: string;
  timeZone: string;
  address: string;
  room: string;
  stations: Array<{
    id: string;
    name: string;
    photographerName: string | null;
    entries: ScheduleEntry[];
  }>;
}

export interface ClientProgress extends ProgressCounts {
  clientId: string;
  days: Array<
    ProgressCounts & {
      dayId: string;
      label: string;
      status: 'proposed' | 'confirmed' | 'cancelled';
    }
  >;
  byOffice: ProgressGroup[];
  byDepartment: ProgressGroup[];
}
