import { z } from 'zod';
import { controlCharacterPattern, uuidSchema } from './common';
import type { MatchReasonName } from './matching';

// Card paths come from the browser's folder upload: relative, forward slashes, printable.

export const cardPathSchema = z
  .string({ error: 'Give the file’s path on the card.' })
  .min(1, { error: 'Give the file’s path on the card.' })
  .max(400, { error: 'That path on the card is too long (400 characters at most).' })
  .refine((value) => !controlCharacterPattern.test(value), {
    error: 'The path on the card contains control characters.',
  })
  .transform((value) => value.replace(/\\/g, '/').replace(/^\/+/, ''))
  .refine((value) => !value.split('/').some((part) => part === '..' || part === '.'), {
    error: 'The path on the card may not step outside the card.',
  })
  .refine((value) => value.length > 0 && !value.endsWith('/'), {
    error: 'The path on the card must name a file.',
  });

export const sha256Schema = z
  .string()
  .regex(/^[0-9a-f]{64}$/, { error: 'Not a SHA-256 digest (64 lower-case hex digits).' });

/** What the browser sends in the tus Upload-Metadata header when it starts a file. */
export const frameUploadMetadataSchema = z.object({
  dayId: uuidSchema,
  stationId: uuidSchema,
  cardPath: cardPathSchema,
  sha256: sha256Schema.optional(),
});
export type FrameUploadMetadata = z.infer<typeof frameUploadMetadataSchema>;

/** A retouched final for a pick: its file name as the editor exported it. */
export const finalUploadMetadataSchema = z.object({
  purpose: z.literal('final'),
  dayId: uuidSchema,
  pickId: uuidSchema,
  cardPath: cardPathSchema,
  sha256: sha256Schema.optional(),
});
export type FinalUploadMetadata = z.infer<typeof finalUploadMetadataSchema>;

/** Before uploading, the page asks which files the day already holds (by path and content). */
export const knownFramesRequestSchema = z.object({
  files: z
    .array(z.object({ cardPath: cardPathSchema, sha256: sha256Schema }))
    .max(5000, { error: 'Ask about at most 5,000 files at a time.' }),
});
export type KnownFramesRequest = z.infer<typeof knownFramesRequestSchema>;

export const frameListQuerySchema = z.object({
  stationId: uuidSchema.optional(),
  status: z.enum(['waiting', 'reading', 'read', 'failed']).optional(),
  page: z.coerce.number().int().min(1).max(100_000).default(1),
  pageSize: z.coerce.number().int().min(1).max(500).default(100),
  /** csv: every frame of the query (no paging), for a spreadsheet. */
  format: z.enum(['json', 'csv'], { error: 'Ask for format=json or format=csv.' }).default('json'),
});
export type FrameListQuery = z.infer<typeof frameListQuerySchema>;

export const ingestStatuses = ['waiting', 'reading', 'read', 'failed'] as const;
export type IngestStatusName = (typeof ingestStatuses)[number];

export const ingestStatusLabels: Record<IngestStatusName, string> = {
  waiting: 'Waiting to be read',
  reading: 'Being read',
  read: 'Read',
  failed: 'Could not be read',
};

export interface FrameSummary {
  id: string;
  stationId: string;
  stationName: string;
  cardPath: string;
  format: 'jpeg' | 'heif' | 'raw';
  byteSize: number;
  dcfFolder: number | null;
  dcfNumber: number | null;
  cameraSerial: string | null;
  cameraModel: string | null;
  /** The camera's wall clock as written, 'YYYY-MM-DDTHH:MM:SS.fff', with no zone. */
  capturedLocal: string | null;
  captureOffset: string | null;
  pixelWidth: number | null;
  pixelHeight: number | null;
  slateToken: string | null;
  /** The sitter whose slate this frame shows, when the token belongs to a sitting of the day. */
  slateSitterName: string | null;
  pairedWithFrameId: string | null;
  hasRaw: boolean;
  noPreview: boolean;
  ingestStatus: IngestStatusName;
  ingestError: string | null;
  uploadedAt: string;
  /** The sitter the frame belongs to now, by a person's decision or by the matcher. */
  personId: string | null;
  employeeId: string | null;
  sitterName: string | null;
  matchReason: MatchReasonName;
  /** A person placed this frame (or marked it a test frame); re-running never changes it. */
  manual: boolean;
}

export interface FramePage {
  frames: FrameSummary[];
  total: number;
  page: number;
  pageSize: number;
}

export interface StationFrameProgress {
  stationId: string;
  stationName: string;
  frames: number;
  waiting: number;
  reading: number;
  read: number;
  failed: number;
  slates: number;
  cameras: string[];
}

export interface DayFramesOverview {
  dayId: string;
  dayDate: string;
  clientName: string;
  officeName: string;
  maxUploadBytes: number;
  stations: StationFrameProgress[];
  refusedUploads: Array<{ cardPath: string; refusal: string; at: string }>;
}

export interface FrameUploadResult {
  outcome: 'stored' | 'duplicate';
  frameId: string;
}
