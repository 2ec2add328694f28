import { z } from 'zod';
import { emailSchema, uuidSchema } from './common';

/**
 * Station console actions. Each carries an idempotency key made on the tablet, so an action
 * queued offline and sent twice is applied once; the ids of what it creates (check-in,
 * sitting, no-show, walk-in person) are also made on the tablet, so the console can show
 * and undo them before the server has seen them.
 */
const frameNumber = z
  .number({ error: 'Enter the frame number shown on the camera.' })
  .int({ error: 'Frame numbers are whole numbers.' })
  // DCF file numbers run 0001-9999 (JEITA CP-3461).
  .min(1, { error: 'Frame numbers run from 0001 to 9999.' })
  .max(9999, { error: 'Frame numbers run from 0001 to 9999.' });

export const slateTokenPattern = /^[A-Z2-7]{26}$/;

const envelope = {
  idempotencyKey: uuidSchema,
  stationId: uuidSchema,
  tabletAt: z.iso.datetime({ offset: true, error: 'The tablet time is missing.' }),
};

const name = (what: string) =>
  z
    .string({ error: `Enter the ${what}.` })
    .trim()
    .min(1, { error: `Enter the ${what}.` })
    .max(80, { error: 'Use at most 80 characters.' });

export const consoleActionSchema = z.discriminatedUnion('kind', [
  z.object({
    ...envelope,
    kind: z.literal('check_in_pass'),
    checkInId: uuidSchema,
    passToken: z.string().trim().toUpperCase().min(1).max(200),
  }),
  z.object({
    ...envelope,
    kind: z.literal('check_in_person'),
    checkInId: uuidSchema,
    personId: uuidSchema,
  }),
  z.object({
    ...envelope,
    kind: z.literal('check_in_new_person'),
    checkInId: uuidSchema,
    personId: uuidSchema,
    givenName: name('given name'),
    familyName: name('family name'),
    email: emailSchema,
  }),
  z.object({
    ...envelope,
    kind: z.literal('start_sitting'),
    sittingId: uuidSchema,
    checkInId: uuidSchema,
    slateToken: z.string().regex(slateTokenPattern, { error: 'Not a slate token.' }),
    firstFrame: frameNumber,
  }),
  z.object({
    ...envelope,
    kind: z.literal('finish_sitting'),
    sittingId: uuidSchema,
    lastFrame: frameNumber.nullable(),
  }),
  z
    .object({
      ...envelope,
      kind: z.literal('correct_frames'),
      sittingId: uuidSchema,
      // Only the numbers being corrected are sent; the other stays as it is.
      firstFrame: frameNumber.optional(),
      lastFrame: frameNumber.optional(),
    })
    .refine((value) => value.firstFrame !== undefined || value.lastFrame !== undefined, {
      error: 'Enter the corrected first or last frame.',
      path: ['firstFrame'],
    }),
  z.object({
    ...envelope,
    kind: z.literal('mark_no_show'),
    noShowId: uuidSchema,
    bookingId: uuidSchema,
  }),
  z.object({ ...envelope, kind: z.literal('undo'), targetKey: uuidSchema }),
]);
export type ConsoleAction = z.infer<typeof consoleActionSchema>;
export type ConsoleActionKind = ConsoleAction['kind'];

export interface ConsoleActionResult {
  idempotencyKey: string;
  kind: ConsoleActionKind;
  /** True when the server had already applied this key: nothing happened twice. */
  replayed: boolean;
  message: string;
}

export const rosterSearchQuerySchema = z.object({
  q: z
    .string({ error: 'Type part of a name or an employee id.' })
    .trim()
    .min(2, { error: 'Type at least two characters.' })
    .max(80),
});

export const consoleEventsQuerySchema = z.object({ stationId: uuidSchema });

export type QueueStatus = 'booked' | 'arrived' | 'in_chair' | 'done' | 'no_show' | 'cancelled';

export interface QueueEntry {
  /** The booking id, or the check-in id for a walk-in. */
  key: string;
  personId: string;
  name: string;
  preferredName: string | null;
  bookingId: string | null;
  /** SHA-256 (hex) of the active booking's pass token, so a tablet can read a pass offline. */
  passHash: string | null;
  /** The booked station, or for walk-ins the station that checked them in. */
  stationId: string | null;
  startsAt: string | null;
  status: QueueStatus;
  walkIn: boolean;
  addedOnDay: boolean;
  glasses: boolean;
  flashSensitive: boolean;
  accessNeeds: string | null;
  checkIn: { id: string; at: string; stationId: string; byName: string | null } | null;
  noShow: { id: string; at: string } | null;
}

export interface SittingView {
  id: string;
  personId: string;
  stationId: string;
  checkInId: string;
  slateToken: string;
  /** The photographer's best numbers: as typed, or as corrected at the station. */
  firstFrame: number;
  lastFrame: number | null;
  /** What was typed on the keypad when the sitting started and finished. */
  typedFirstFrame: number;
  typedLastFrame: number | null;
  /** Set once the numbers were corrected; the typed ones then differ or were confirmed. */
  framesCorrectedAt: string | null;
  startedAt: string;
  finishedAt: string | null;
}

export interface ConsoleStation {
  id: string;
  name: string;
  position: number;
  photographerName: string | null;
}

export interface ConsoleSnapshot {
  day: {
    id: string;
    date: string;
    clientName: string;
    officeName: string;
    timeZone: string;
    address: string;
    room: string;
    slotMinutes: number;
    graceMinutes: number;
  };
  stations: ConsoleStation[];
  entries: QueueEntry[];
  sittings: SittingView[];
  serverTime: string;
  /** Coordinators see the console but may not change it. */
  canAct: boolean;
}

export interface ConsoleDay {
  id: string;
  date: string;
  clientName: string;
  officeName: string;
  stations: Array<ConsoleStation & { mine: boolean }>;
}

export interface RosterMatch {
  id: string;
  name: string;
  employeeId: string | null;
  department: string | null;
  officeName: string | null;
  checkedIn: boolean;
}
