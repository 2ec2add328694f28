import { z } from 'zod';
import { allowLineBreaks, controlCharacterPattern, uuidSchema } from './common';

export const pickNoteLimit = 300;

/** Line breaks are fine in a note; other control characters are not. */
// eslint-disable-next-line no-control-regex
const noteControlPattern = /[\u0000-\u0009\u000b\u000c\u000e-\u001f\u007f-\u009f]/;

export const pickNoteSchema = allowLineBreaks(
  z
    .string()
    .trim()
    .max(pickNoteLimit, { error: `Keep the note to ${pickNoteLimit} characters.` })
    .refine((value) => !noteControlPattern.test(value), {
      error: 'The note contains control characters.',
    }),
);

export const savePicksRequestSchema = z
  .object({
    picks: z
      .array(z.object({ frameId: uuidSchema, note: pickNoteSchema.nullish() }).strict(), {
        error: 'Send the frames you pick.',
      })
      .max(40, { error: 'Pick at most 40 frames.' })
      .refine((picks) => new Set(picks.map((pick) => pick.frameId)).size === picks.length, {
        error: 'A frame is picked twice.',
      }),
  })
  .strict();
export type SavePicksRequest = z.infer<typeof savePicksRequestSchema>;

export const proofSettingsSchema = z
  .object({
    picksIncluded: z.coerce
      .number({ error: 'Give a number of portraits.' })
      .int()
      .min(1, { error: 'At least one portrait is included.' })
      .max(20, { error: 'At most 20 portraits.' }),
    extraPicksAllowed: z.coerce.number().int().min(0).max(20, { error: 'At most 20 extra.' }),
    extraPickPriceCents: z.coerce
      .number()
      .int()
      .min(0, { error: 'A price cannot be negative.' })
      .max(10_000_000),
    hrMayChoose: z.boolean(),
  })
  .strict();
export type ProofSettingsInput = z.infer<typeof proofSettingsSchema>;

export const releaseProofsRequestSchema = z
  .object({
    /** The last day to pick, in the day's own zone; 7 days after the shoot unless given. */
    picksCloseOn: z
      .string()
      .regex(/^\d{4}-\d{2}-\d{2}$/, { error: 'Give the date as YYYY-MM-DD.' })
      .refine((value) => !Number.isNaN(Date.parse(`${value}T00:00:00Z`)), {
        error: 'That is not a date.',
      })
      .optional(),
  })
  .strict();

export const studioPickRequestSchema = z.object({ frameId: uuidSchema }).strict();

export const retouchStatuses = ['to_do', 'in_progress', 'done'] as const;
export type RetouchStatusName = (typeof retouchStatuses)[number];
export const retouchStatusLabels: Record<RetouchStatusName, string> = {
  to_do: 'To do',
  in_progress: 'In progress',
  done: 'Done',
};

export const retouchQuerySchema = z.object({
  stationId: uuidSchema.optional(),
  status: z.enum(retouchStatuses).optional(),
  q: z
    .string()
    .max(100)
    .refine((value) => !controlCharacterPattern.test(value), {
      error: 'The search contains control characters.',
    })
    .optional(),
  sort: z.enum(['sitter', 'station', 'status', 'picked']).default('sitter'),
  dir: z.enum(['asc', 'desc']).default('asc'),
  page: z.coerce.number().int().min(1).max(10_000).default(1),
  pageSize: z.coerce.number().int().min(1).max(200).default(50),
});
export type RetouchQuery = z.infer<typeof retouchQuerySchema>;

export const retouchUpdateSchema = z
  .object({
    status: z.enum(retouchStatuses, { error: 'Choose to do, in progress or done.' }).optional(),
    /** Take the pick (it becomes yours), or let it go. */
    takenByMe: z.boolean().optional(),
  })
  .strict()
  .refine((value) => value.status !== undefined || value.takenByMe !== undefined, {
    error: 'Say what to change.',
  });

export interface ProofFrame {
  id: string;
  label: string;
  url: string;
  width: number | null;
  height: number | null;
}

export interface SitterProofs {
  dayId: string;
  date: string;
  clientName: string;
  picksCloseAt: string;
  open: boolean;
  package: { included: number; extraAllowed: number; extraPriceCents: number };
  frames: ProofFrame[];
  picks: Array<{ frameId: string; note: string | null }>;
  /** Whose choice stands now: yours, the studio's or the first frame after the slate. */
  standing: 'yours' | 'coordinator' | 'studio' | 'fallback' | null;
}

export interface ProofDaySummary {
  dayId: string;
  date: string;
  clientName: string;
  picksCloseAt: string;
  open: boolean;
  picked: boolean;
}

export interface ProofProgress {
  released: boolean;
  releasedAt: string | null;
  picksCloseAt: string | null;
  open: boolean;
  withProofs: number;
  picked: number;
  notPicked: number;
  settings: ProofSettingsInput;
}

export interface RetouchRow {
  pickId: string;
  personId: string;
  sitterName: string;
  employeeId: string | null;
  stationName: string;
  frameId: string;
  fileName: string;
  chosenBy: 'sitter' | 'coordinator' | 'studio' | 'fallback';
  note: string | null;
  flashSensitive: boolean;
  glasses: boolean;
  status: RetouchStatusName;
  takenBy: string | null;
  takenByMe: boolean;
  hasFinal: boolean;
  finalFileName: string | null;
  /** The sitter changed the note after the final was sent back. */
  noteChangedSinceFinal: boolean;
  /** The note the final was made with (when there is a final). */
  noteAtFinal: string | null;
  pickedAt: string;
}

export interface RetouchPage {
  rows: RetouchRow[];
  total: number;
  page: number;
  pageSize: number;
  picksCloseAt: string | null;
  counts: Record<RetouchStatusName, number>;
}
