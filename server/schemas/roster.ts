import { z } from 'zod';
import { emailSchema } from './common';

/** Our own fields a roster column can fill. */
export const rosterFields = [
  'givenName',
  'familyName',
  'preferredName',
  'email',
  'employeeId',
  'department',
  'jobTitle',
  'office',
] as const;
export type RosterField = (typeof rosterFields)[number];

export const rosterFieldLabels: Record<RosterField, string> = {
  givenName: 'Given name',
  familyName: 'Family name',
  preferredName: 'Preferred name',
  email: 'Work e-mail',
  employeeId: 'Employee id',
  department: 'Department',
  jobTitle: 'Job title',
  office: 'Office',
};

/**
 * Each column goes to one of our fields, says whether the person is active ("status"), is kept
 * as an extra as it is, or is left out.
 */
export const columnTargetSchema = z.enum([...rosterFields, 'status', 'extra', 'ignore']);
export type ColumnTarget = z.infer<typeof columnTargetSchema>;

export const columnMappingSchema = z
  .array(columnTargetSchema)
  .max(200)
  .superRefine((mapping, context) => {
    for (const field of rosterFields) {
      if (mapping.filter((target) => target === field).length > 1) {
        context.addIssue({
          code: 'custom',
          message: `Only one column can be the ${rosterFieldLabels[field].toLowerCase()}.`,
        });
      }
    }
    if (mapping.filter((target) => target === 'status').length > 1) {
      context.addIssue({ code: 'custom', message: 'Only one column can be the status.' });
    }
    for (const field of ['givenName', 'familyName', 'email'] as const) {
      if (!mapping.includes(field)) {
        context.addIssue({
          code: 'custom',
          message: `Choose the column that holds the ${rosterFieldLabels[field].toLowerCase()}.`,
        });
      }
    }
  });
export type ColumnMapping = z.infer<typeof columnMappingSchema>;

/** The mapping choice for a column saying whether each person is active. */
export const statusTargetLabel = 'Status (active or not)';

// Words HR exports write for someone on staff or gone (common practice in HR exports; the
// Dutch, German, French, Spanish and Portuguese words are from memory of everyday usage).
const activeWords = new Set([
  'active',
  'yes',
  'y',
  'true',
  '1',
  'employed',
  'current',
  'actief',
  'aktiv',
  'actif',
  'activo',
  'ativo',
]);
const inactiveWords = new Set([
  'inactive',
  'no',
  'n',
  'false',
  '0',
  'left',
  'leaver',
  'terminated',
  'former',
  'resigned',
  'retired',
  'deactivated',
  'inactief',
  'inaktiv',
  'inactif',
  'inactivo',
  'inativo',
]);

/**
 * A status cell: true for someone on staff, false for someone gone, null when blank (the file
 * does not say), undefined when it is neither.
 */
export function readStatus(cell: string | undefined): boolean | null | undefined {
  const word = (cell ?? '').trim().toLowerCase();
  if (word === '') return null;
  if (activeWords.has(word)) return true;
  if (inactiveWords.has(word)) return false;
  return undefined;
}

/**
 * The longest name or label a person's field holds, in code points (zod counts those once a
 * string is longer in UTF-16 units than the limit).
 */
export const personTextLimit = 200;

const requiredText = (what: string) =>
  z
    .string({ error: `Enter the ${what}.` })
    .trim()
    .min(1, { error: `Enter the ${what}.` })
    .max(personTextLimit, { error: `Use at most ${personTextLimit} characters.` });

/** Empty means "none": stored as null. */
const optionalText = z
  .string()
  .trim()
  .max(personTextLimit, { error: `Use at most ${personTextLimit} characters.` })
  .transform((value) => (value === '' ? null : value))
  .nullable()
  .optional()
  .transform((value) => value ?? null);

/** One person as a roster row or the hand-edit form gives it. */
export const personFieldsSchema = z.object({
  givenName: requiredText('given name'),
  familyName: requiredText('family name'),
  preferredName: optionalText,
  email: emailSchema,
  employeeId: optionalText,
  department: optionalText,
  jobTitle: optionalText,
});
export type PersonFields = z.infer<typeof personFieldsSchema>;

export const rosterRowSchema = personFieldsSchema.extend({ office: optionalText });
export type RosterRow = z.infer<typeof rosterRowSchema>;

export const savePersonRequestSchema = personFieldsSchema.extend({
  officeId: z
    .union([z.uuid({ error: 'Choose an office from the list.' }), z.literal('')])
    .optional()
    .transform((value) => (value ? value : null)),
});
export type SavePersonRequest = z.input<typeof savePersonRequestSchema>;

export const setActiveRequestSchema = z
  .object({ active: z.boolean({ error: 'Say whether the person is active.' }) })
  .strict();

export const erasePersonRequestSchema = z.object({
  confirmEmail: z
    .string({ error: "Type the person's e-mail address to confirm." })
    .trim()
    .toLowerCase()
    .min(1, { error: "Type the person's e-mail address to confirm." }),
});

/**
 * What commit does with a row. A conflict is a row whose e-mail belongs to a person with a
 * different employee id: left out unless the coordinator says they are the same people.
 */
export const previewKinds = ['add', 'update', 'conflict', 'unchanged', 'error', 'missing'] as const;
export type PreviewKind = (typeof previewKinds)[number];

export const previewCountsSchema = z.object({
  add: z.number(),
  update: z.number(),
  conflict: z.number(),
  unchanged: z.number(),
  error: z.number(),
  missing: z.number(),
});
export type PreviewCounts = z.infer<typeof previewCountsSchema>;

export interface RosterDraft {
  id: string;
  fileName: string;
  encoding: string;
  delimiter: string;
  rowCount: number;
  headers: string[];
  /** Columns whose field was guessed from their values (a column of addresses is the e-mail). */
  guessedColumns: number[];
  sampleRows: string[][];
  mapping: ColumnMapping;
  /** Why the mapping cannot be previewed yet (a required field without a column...). */
  mappingProblems: string[];
  /** Every column is mapped as in this client's last import: no need to show the mapping. */
  mappingRemembered: boolean;
  counts: PreviewCounts;
  /** Rows of any kind that come with a warning (a stored name kept, characters removed). */
  rowsWithWarnings: number;
  newOffices: string[];
  knownOffices: Array<{ id: string; name: string; timeZone: string }>;
  expiresAt: string;
}

/** Field values as shown in the preview; `extras` holds the kept-as-is columns. */
export type PreviewValues = Partial<Record<RosterField, string | null>> & {
  extras?: Record<string, string>;
  active?: boolean;
};

export interface PreviewRow {
  position: number;
  rowNumber: number | null;
  kind: PreviewKind;
  personId: string | null;
  values: PreviewValues;
  before: PreviewValues | null;
  changedFields: string[];
  errors: Record<string, string>;
  /** What the row keeps or changes that the coordinator should know (per field or column). */
  warnings: Record<string, string>;
}

export const previewQuerySchema = z.object({
  // "warned": rows of any kind that come with a warning.
  kind: z.enum([...previewKinds, 'all', 'warned']).default('all'),
  page: z.coerce.number().int().min(1).default(1),
  pageSize: z.coerce.number().int().min(5).max(200).default(25),
  sort: z.enum(['position', 'name', 'email', 'kind']).default('position'),
  direction: z.enum(['asc', 'desc']).default('asc'),
  q: z.string().trim().max(200).default(''),
});
export type PreviewQuery = z.input<typeof previewQuerySchema>;

export interface PreviewPage {
  rows: PreviewRow[];
  total: number;
  page: number;
  pageSize: number;
}

export const remapRequestSchema = z.object({ mapping: z.array(columnTargetSchema).max(200) });

export const uploadQuerySchema = z.object({
  fileName: z.string().trim().min(1).max(200).catch('roster.csv'),
});

export const commitImportRequestSchema = z.object({
  officeTimeZones: z.record(
    z.string(),
    z.string().refine(isTimeZone, { error: 'Choose a time zone from the list.' }),
  ),
  // Off unless asked: an export of one office would otherwise deactivate everyone else.
  deactivateMissing: z.boolean().default(false),
  // Conflicts are left out unless the coordinator confirms they are the same people.
  rekeyConflicts: z.boolean().default(false),
});
export type CommitImportRequest = z.input<typeof commitImportRequestSchema>;

export function isTimeZone(value: string): boolean {
  try {
    new Intl.DateTimeFormat('en', { timeZone: value });
    return value.includes('/') || value === 'UTC';
  } catch {
    return false;
  }
}

export interface ImportSummary {
  id: string;
  fileName: string;
  importedAt: string;
  importedBy: string | null;
  added: number;
  updated: number;
  unchanged: number;
  deactivated: number;
  skipped: number;
  officesCreated: number;
}
