import { z } from 'zod';
import { uuidSchema } from './common';

const clockTime = z
  .string({ error: 'Enter a time like 09:00.' })
  .regex(/^([01]\d|2[0-3]):[0-5]\d$/, { error: 'Enter a time like 09:00.' });
const minutesOf = (time: string) => Number(time.slice(0, 2)) * 60 + Number(time.slice(3, 5));
const instant = z.iso.datetime({ offset: true, error: 'Enter a date and time.' });

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
    date: z.iso.date({ error: 'Pick the date of the day.' }),
    address: z.string().trim().min(3, { error: 'Enter the address.' }).max(300),
    room: z.string().trim().max(120).default(''),
    opensAt: clockTime,
    closesAt: clockTime,
    breaks: z.array(breakSchema).max(6).default([]),
    slotMinutes: z.coerce
      .number({ error: 'Enter the slot length in minutes.' })
      .int()
      .min(3, { error: 'Use at least 3 minutes.' })
      .max(60, { error: 'Use at most 60 minutes.' })
      .default(5),
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
  status: z.enum(['proposed', 'confirmed']),
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
});
export type SlotWithSeats = z.infer<typeof slotSchema>;
export type SlotList = { timeZone: string; slots: SlotWithSeats[] };

export const mailingKinds = [
  'invitation',
  'reminder',
  'day_before',
  'proofs',
  'proofs_reminder',
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
  }>;
}
export interface QueuedMailings {
  queued: number;
  alreadyQueued: number;
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
  /** Invited people without a booking (no-shows did book, so they are not here). */
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
      status: 'proposed' | 'confirmed';
    }
  >;
  byOffice: ProgressGroup[];
  byDepartment: ProgressGroup[];
}
