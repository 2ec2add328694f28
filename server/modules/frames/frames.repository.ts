import { sql, type Transaction } from 'kysely';
import type { Db } from '../../db/database';
import type {
  FrameFormat,
  FramesTable,
  FrameUploadStatus,
  IngestStatus,
} from '../../db/frame-types';
import type { Database } from '../../db/types';
import type {
  FrameListQuery,
  FrameSummary,
  StationFrameProgress,
  DayFramesOverview,
} from '../../schemas/frames';
import type { MatchReasonName } from '../../schemas/matching';
import {
  activeDecisionsQuery,
  effectivePersonId,
  matchedFrameKey,
  sitterName,
} from '../matching/matching.repository';

type Executor = Db | Transaction<Database>;

export interface UploadRecord {
  id: string;
  dayId: string;
  /** A card's frame names its station; a retouched final names its pick instead. */
  stationId: string | null;
  purpose: 'frame' | 'final';
  pickId: string | null;
  userId: string | null;
  cardPath: string;
  declaredSize: number;
  declaredSha256: string | null;
  status: FrameUploadStatus;
  frameId: string | null;
}

export async function insertUpload(
  db: Executor,
  upload: Omit<UploadRecord, 'status' | 'frameId' | 'purpose' | 'pickId'> &
    Partial<Pick<UploadRecord, 'purpose' | 'pickId'>>,
) {
  await db
    .insertInto('frameUploads')
    .values({ ...upload, declaredSize: upload.declaredSize })
    .execute();
}

export async function findUpload(db: Executor, id: string): Promise<UploadRecord | undefined> {
  const row = await db
    .selectFrom('frameUploads')
    .select([
      'id',
      'dayId',
      'stationId',
      'purpose',
      'pickId',
      'userId',
      'cardPath',
      'declaredSize',
      'declaredSha256',
      'status',
      'frameId',
    ])
    .where('id', '=', id)
    .executeTakeFirst();
  return row ? { ...row, declaredSize: Number(row.declaredSize) } : undefined;
}

export async function closeUpload(
  db: Executor,
  id: string,
  outcome: { status: FrameUploadStatus; refusal?: string; frameId?: string },
) {
  await db
    .updateTable('frameUploads')
    .set({
      status: outcome.status,
      refusal: outcome.refusal ?? null,
      frameId: outcome.frameId ?? null,
      finishedAt: sql`now()`,
    })
    .where('id', '=', id)
    .execute();
}

/**
 * The day's frame with these bytes, under whatever name it came: the same file chosen again
 * from another folder (or renamed) is the same photo, not a new proof.
 */
export async function findFrameByContent(
  db: Executor,
  dayId: string,
  sha256: string,
): Promise<string | undefined> {
  const row = await db
    .selectFrom('frames')
    .select('id')
    .where('dayId', '=', dayId)
    .where('contentSha256', '=', sha256)
    .executeTakeFirst();
  return row?.id;
}

/** A frame's row as the upload writes it; reading fills in the rest later. */
export type NewFrame = Pick<
  FramesTable,
  | 'id'
  | 'dayId'
  | 'stationId'
  | 'uploadedByUserId'
  | 'cardPath'
  | 'contentSha256'
  | 'format'
  | 'originalKey'
  | 'dcfFolder'
  | 'dcfNumber'
  | 'dcfStem'
> & { byteSize: number };

/** Inserts the frame; a concurrent twin (same day, path and content) makes this return false. */
export async function insertFrame(trx: Executor, frame: NewFrame): Promise<boolean> {
  const result = await trx
    .insertInto('frames')
    .values(frame)
    .onConflict((conflict) => conflict.columns(['dayId', 'cardPath', 'contentSha256']).doNothing())
    .executeTakeFirst();
  return Number(result.numInsertedOrUpdatedRows ?? 0) === 1;
}

/**
 * A raw file and a JPEG with the same folder, stem and number at one station are one frame in
 * two formats (DCF, JEITA CP-3461). Pairs only when exactly one partner exists: after a card
 * reset the same name can come back, and a guess would tie the wrong files together.
 */
export async function pairWithPartner(trx: Executor, frame: NewFrame): Promise<void> {
  if (frame.dcfFolder === null || frame.dcfNumber === null || frame.dcfStem === null) return;
  const partners = await trx
    .selectFrom('frames')
    .select(['id', 'format'])
    .where('dayId', '=', frame.dayId)
    .where('stationId', '=', frame.stationId)
    .where('dcfFolder', '=', frame.dcfFolder)
    .where('dcfNumber', '=', frame.dcfNumber)
    .where('dcfStem', '=', frame.dcfStem)
    .where('id', '!=', frame.id)
    .where('format', frame.format === 'raw' ? '!=' : '=', 'raw')
    .execute();
  const [partner] = partners;
  if (!partner || partners.length !== 1) return;
  const [rawId, viewableId] =
    frame.format === 'raw' ? [frame.id, partner.id] : [partner.id, frame.id];
  await trx
    .updateTable('frames')
    .set({ pairedWithFrameId: viewableId })
    .where('id', '=', rawId)
    .execute();
}

export interface StoredFrame {
  id: string;
  dayId: string;
  stationId: string;
  cardPath: string;
  format: FrameFormat;
  originalKey: string;
  previewKey: string | null;
  thumbnailKey: string | null;
  ingestStatus: IngestStatus;
}

export async function findFrame(db: Executor, id: string): Promise<StoredFrame | undefined> {
  return db
    .selectFrom('frames')
    .select([
      'id',
      'dayId',
      'stationId',
      'cardPath',
      'format',
      'originalKey',
      'previewKey',
      'thumbnailKey',
      'ingestStatus',
    ])
    .where('id', '=', id)
    .executeTakeFirst();
}

export async function markReading(db: Executor, id: string): Promise<void> {
  await db
    .updateTable('frames')
    .set({ ingestStatus: 'reading', ingestError: null })
    .where('id', '=', id)
    .execute();
}

/** What reading a frame fills in on its row. */
export type FrameReadingRecord = Pick<
  FramesTable,
  | 'previewKey'
  | 'thumbnailKey'
  | 'cameraSerial'
  | 'cameraMake'
  | 'cameraModel'
  | 'capturedLocal'
  | 'captureOffset'
  | 'orientation'
  | 'pixelWidth'
  | 'pixelHeight'
  | 'slateToken'
> & { noPreview: boolean };

export async function saveReading(db: Executor, id: string, reading: FrameReadingRecord) {
  await db
    .updateTable('frames')
    .set({ ...reading, ingestStatus: 'read', ingestError: null, readAt: sql`now()` })
    .where('id', '=', id)
    .execute();
}

export async function saveFailure(db: Executor, id: string, message: string) {
  await db
    .updateTable('frames')
    .set({ ingestStatus: 'failed', ingestError: message.slice(0, 500), readAt: sql`now()` })
    .where('id', '=', id)
    .execute();
}

export async function knownFiles(
  db: Executor,
  dayId: string,
  files: Array<{ cardPath: string; sha256: string }>,
): Promise<Array<{ cardPath: string; sha256: string }>> {
  if (files.length === 0) return [];
  // Known by content alone, as findFrameByContent: the name on this card may differ.
  const rows = await db
    .selectFrom('frames')
    .select('contentSha256')
    .where('dayId', '=', dayId)
    .where('contentSha256', 'in', [...new Set(files.map((file) => file.sha256))])
    .execute();
  const known = new Set(rows.map((row) => row.contentSha256));
  return files.filter((file) => known.has(file.sha256));
}

/** One page of the day's frames, or every frame when `paged` is false (the CSV). */
export async function listFrames(
  db: Executor,
  dayId: string,
  query: FrameListQuery,
  paged = true,
): Promise<{ frames: FrameSummary[]; total: number }> {
  let base = db.selectFrom('frames').where('frames.dayId', '=', dayId);
  if (query.stationId) base = base.where('frames.stationId', '=', query.stationId);
  if (query.status) base = base.where('frames.ingestStatus', '=', query.status);
  const [rows, count] = await Promise.all([
    base
      .innerJoin('stations', 'stations.id', 'frames.stationId')
      // A raw file shares its JPEG's match: the JPEG is the frame that was matched.
      .leftJoin('frameMatches as auto', (join) => join.on('auto.frameId', '=', matchedFrameKey))
      .leftJoin(activeDecisionsQuery(db, dayId).as('decision'), (join) =>
        join.on('decision.frameId', '=', matchedFrameKey),
      )
      .leftJoin('people as sitter', (join) => join.on('sitter.id', '=', effectivePersonId))
      .select([
        'frames.id',
        'frames.stationId',
        'stations.name as stationName',
        'frames.cardPath',
        'frames.format',
        'frames.byteSize',
        'frames.dcfFolder',
        'frames.dcfNumber',
        'frames.cameraSerial',
        'frames.cameraModel',
        sql<string | null>`to_char(frames.captured_local, 'YYYY-MM-DD"T"HH24:MI:SS.MS')`.as(
          'capturedLocal',
        ),
        'frames.captureOffset',
        'frames.pixelWidth',
        'frames.pixelHeight',
        'frames.slateToken',
        sql<string | null>`(
          select coalesce(people.preferred_name, people.given_name) || ' ' || people.family_name
          from sittings join people on people.id = sittings.person_id
          where sittings.slate_token = frames.slate_token and sittings.day_id = frames.day_id)`.as(
          'slateSitterName',
        ),
        'frames.pairedWithFrameId',
        sql<boolean>`exists (select 1 from frames as raw where raw.paired_with_frame_id = frames.id)`.as(
          'hasRaw',
        ),
        'frames.noPreview',
        'frames.ingestStatus',
        'frames.ingestError',
        'frames.uploadedAt',
        'sitter.id as personId',
        'sitter.employeeId',
        sql<
          string | null
        >`case when sitter.id is null then null else ${sitterName('sitter')} end`.as('sitterName'),
        sql<MatchReasonName>`case
          when decision.action = 'test_frame' then 'manual_test_frame'
          when decision.action is not null then 'manual'
          else coalesce(auto.reason, 'not_read_yet') end`.as('matchReason'),
        sql<boolean>`decision.action is not null`.as('manual'),
      ])
      .orderBy('stations.position')
      .orderBy('frames.dcfFolder')
      .orderBy('frames.dcfNumber')
      .orderBy('frames.cardPath')
      .orderBy('frames.id')
      .$if(paged, (qb) => qb.limit(query.pageSize).offset((query.page - 1) * query.pageSize))
      .execute(),
    base.select((eb) => eb.fn.countAll<string>().as('total')).executeTakeFirstOrThrow(),
  ]);
  return {
    frames: rows.map((row) => ({
      ...row,
      byteSize: Number(row.byteSize),
      uploadedAt: row.uploadedAt.toISOString(),
    })),
    total: Number(count.total),
  };
}

export async function stationProgress(
  db: Executor,
  dayId: string,
): Promise<StationFrameProgress[]> {
  const rows = await db
    .selectFrom('stations')
    .leftJoin('frames', 'frames.stationId', 'stations.id')
    .select([
      'stations.id as stationId',
      'stations.name as stationName',
      sql<string>`count(frames.id)`.as('frames'),
      sql<string>`count(frames.id) filter (where frames.ingest_status = 'waiting')`.as('waiting'),
      sql<string>`count(frames.id) filter (where frames.ingest_status = 'reading')`.as('reading'),
      sql<string>`count(frames.id) filter (where frames.ingest_status = 'read')`.as('read'),
      sql<string>`count(frames.id) filter (where frames.ingest_status = 'failed')`.as('failed'),
      sql<string>`count(frames.slate_token)`.as('slates'),
      sql<
        string[]
      >`coalesce(array_agg(distinct frames.camera_serial) filter (where frames.camera_serial is not null), '{}')`.as(
        'cameras',
      ),
    ])
    .where('stations.dayId', '=', dayId)
    .groupBy(['stations.id', 'stations.name', 'stations.position'])
    .orderBy('stations.position')
    .execute();
  return rows.map((row) => ({
    stationId: row.stationId,
    stationName: row.stationName,
    frames: Number(row.frames),
    waiting: Number(row.waiting),
    reading: Number(row.reading),
    read: Number(row.read),
    failed: Number(row.failed),
    slates: Number(row.slates),
    cameras: row.cameras,
  }));
}

export async function recentRefusals(
  db: Executor,
  dayId: string,
): Promise<DayFramesOverview['refusedUploads']> {
  const rows = await db
    .selectFrom('frameUploads')
    .select(['cardPath', 'refusal', 'finishedAt'])
    .where('dayId', '=', dayId)
    .where('status', '=', 'refused')
    .orderBy('finishedAt', 'desc')
    .limit(50)
    .execute();
  return rows.map((row) => ({
    cardPath: row.cardPath,
    refusal: row.refusal ?? 'Refused.',
    at: (row.finishedAt ?? new Date()).toISOString(),
  }));
}
