import type { ColumnType, Generated } from 'kysely';

type DefaultedTimestamp = ColumnType<Date, Date | string | undefined, Date | string>;
type OptionalTimestamp = ColumnType<
  Date | null,
  Date | string | null | undefined,
  Date | string | null
>;
/** bigint columns arrive from pg as strings (they may exceed 2^53). */
type BigIntColumn = ColumnType<string, number | string, number | string>;

export type FrameUploadStatus = 'receiving' | 'stored' | 'duplicate' | 'refused';
export type FrameFormat = 'jpeg' | 'heif' | 'raw';
export type IngestStatus = 'waiting' | 'reading' | 'read' | 'failed';

export interface FrameUploadsTable {
  id: string;
  dayId: string;
  /** Set for a card's frame; a retouched final names its pick instead. */
  stationId: string | null;
  purpose: ColumnType<'frame' | 'final', 'frame' | 'final' | undefined, 'frame' | 'final'>;
  pickId: ColumnType<string | null, string | null | undefined, string | null>;
  userId: string | null;
  cardPath: string;
  declaredSize: BigIntColumn;
  declaredSha256: string | null;
  status: ColumnType<FrameUploadStatus, FrameUploadStatus | undefined, FrameUploadStatus>;
  refusal: string | null;
  frameId: string | null;
  createdAt: DefaultedTimestamp;
  finishedAt: OptionalTimestamp;
}

export interface FramesTable {
  id: string;
  dayId: string;
  stationId: string;
  uploadedByUserId: string | null;
  cardPath: string;
  contentSha256: string;
  byteSize: BigIntColumn;
  format: FrameFormat;
  originalKey: string;
  previewKey: string | null;
  thumbnailKey: string | null;
  noPreview: Generated<boolean>;
  dcfFolder: number | null;
  dcfNumber: number | null;
  dcfStem: string | null;
  cameraSerial: string | null;
  cameraMake: string | null;
  cameraModel: string | null;
  /** 'YYYY-MM-DD HH:MM:SS.fff' as the camera wrote it: the timestamp type parser keeps it text. */
  capturedLocal: string | null;
  captureOffset: string | null;
  orientation: number | null;
  pixelWidth: number | null;
  pixelHeight: number | null;
  slateToken: string | null;
  pairedWithFrameId: string | null;
  ingestStatus: ColumnType<IngestStatus, IngestStatus | undefined, IngestStatus>;
  ingestError: string | null;
  uploadedAt: DefaultedTimestamp;
  readAt: OptionalTimestamp;
}
