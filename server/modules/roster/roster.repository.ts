import { sql } from 'kysely';
import type { Db } from '../../db/database';
import type { DecodeWarning } from '../../db/roster-types';
import type { ColumnMapping, PreviewCounts } from '../../schemas/roster';
import type { ExistingPerson } from './roster-diff';

export interface DraftRecord {
  id: string;
  clientId: string;
  fileName: string;
  encoding: string;
  hadByteOrderMark: boolean;
  delimiter: string;
  headers: string[];
  /** Columns whose field was guessed from their values. */
  guessedColumns: number[];
  rowCount: number;
  sampleRows: string[][];
  mapping: ColumnMapping;
  counts: PreviewCounts;
  /** Preview rows with at least one warning (decoding or matching). */
  rowsWithWarnings: number;
  newOffices: string[];
  rosterVersion: string;
  expiresAt: Date;
}

export interface OfficeRecord {
  id: string;
  name: string;
  timeZone: string;
}

export async function clientExists(db: Db, clientId: string): Promise<boolean> {
  const row = await db
    .selectFrom('clients')
    .select('id')
    .where('id', '=', clientId)
    .executeTakeFirst();
  return row !== undefined;
}

/**
 * Claims the commit of one draft for this transaction, without waiting: false while another
 * request is saving it. Released when the transaction ends, even if the server dies.
 */
export async function tryClaimDraftCommit(trx: Db, draftId: string): Promise<boolean> {
  const result = await sql<{ claimed: boolean }>`
    select pg_try_advisory_xact_lock(hashtextextended(${`roster-commit:${draftId}`}, 0)) as claimed`.execute(
    trx,
  );
  return result.rows[0]?.claimed === true;
}

/** Serialises imports of one client: the second waits for the first to commit. */
export async function lockClient(db: Db, clientId: string): Promise<void> {
  await db.selectFrom('clients').select('id').where('id', '=', clientId).forUpdate().execute();
}

/** Changes whenever a person of the client is added, changed or removed. */
export async function rosterVersion(db: Db, clientId: string): Promise<string> {
  const row = await db
    .selectFrom('people')
    .select(
      sql<string>`count(*)::text || ':' || coalesce(max(updated_at)::text, '-')`.as('version'),
    )
    .where('clientId', '=', clientId)
    .executeTakeFirstOrThrow();
  return row.version;
}

export async function listOffices(db: Db, clientId: string): Promise<OfficeRecord[]> {
  return db
    .selectFrom('offices')
    .select(['id', 'name', 'timeZone'])
    .where('clientId', '=', clientId)
    .orderBy('name')
    .execute();
}

export async function loadRoster(db: Db, clientId: string): Promise<ExistingPerson[]> {
  return db
    .selectFrom('people')
    .leftJoin('offices', 'offices.id', 'people.officeId')
    .select([
      'people.id',
      'people.givenName',
      'people.familyName',
      'people.preferredName',
      'people.email',
      'people.employeeId',
      'people.department',
      'people.jobTitle',
      'offices.name as officeName',
      'people.extras',
      'people.active',
    ])
    .where('people.clientId', '=', clientId)
    .orderBy('people.familyName')
    .orderBy('people.givenName')
    .execute();
}

export async function savedMapping(db: Db, clientId: string): Promise<Record<string, string>> {
  const row = await db
    .selectFrom('rosterMappings')
    .select('mapping')
    .where('clientId', '=', clientId)
    .executeTakeFirst();
  return row?.mapping ?? {};
}

export async function saveMapping(db: Db, clientId: string, mapping: Record<string, string>) {
  await db
    .insertInto('rosterMappings')
    .values({ clientId, mapping: JSON.stringify(mapping) })
    .onConflict((oc) =>
      oc
        .column('clientId')
        .doUpdateSet({ mapping: JSON.stringify(mapping), updatedAt: sql`now()` }),
    )
    .execute();
}

/**
 * One open draft per uploader and client: their new upload replaces their last, while another
 * person's preview stays; expired drafts of anyone go too.
 */
export async function deleteStaleDrafts(
  db: Db,
  clientId: string,
  uploaderId: string,
): Promise<void> {
  const stale = await db
    .deleteFrom('rosterImportDrafts')
    .where((eb) =>
      eb.or([
        eb.and([eb('clientId', '=', clientId), eb('createdBy', '=', uploaderId)]),
        eb('expiresAt', '<', sql<Date>`now()`),
      ]),
    )
    .returning('id')
    .execute();
  if (stale.length === 0) return;
  await db
    .deleteFrom('rosterImportRows')
    .where(
      'draftId',
      'in',
      stale.map((draft) => draft.id),
    )
    .execute();
}

export async function insertDraft(
  db: Db,
  draft: Omit<DraftRecord, 'rowCount' | 'sampleRows'> & {
    createdBy: string | null;
    rawRows: string[][];
    rowNumbers: number[] | null;
    decodeWarnings: DecodeWarning[];
  },
): Promise<string> {
  const row = await db
    .insertInto('rosterImportDrafts')
    .values({
      id: draft.id,
      clientId: draft.clientId,
      createdBy: draft.createdBy,
      fileName: draft.fileName,
      encoding: draft.encoding,
      hadByteOrderMark: draft.hadByteOrderMark,
      decodeWarnings: JSON.stringify(draft.decodeWarnings),
      guessedColumns: JSON.stringify(draft.guessedColumns),
      delimiter: draft.delimiter,
      headers: JSON.stringify(draft.headers),
      rowNumbers: draft.rowNumbers ? JSON.stringify(draft.rowNumbers) : null,
      rowCount: draft.rawRows.length,
      sampleRows: JSON.stringify(draft.rawRows.slice(0, 3)),
      mapping: JSON.stringify(draft.mapping),
      counts: JSON.stringify(draft.counts),
      rowsWithWarnings: draft.rowsWithWarnings,
      newOffices: JSON.stringify(draft.newOffices),
      rosterVersion: draft.rosterVersion,
      expiresAt: draft.expiresAt,
    })
    .returning('id')
    .executeTakeFirstOrThrow();
  return row.id;
}

export async function updateDraftPreview(
  db: Db,
  draftId: string,
  preview: Pick<
    DraftRecord,
    'mapping' | 'counts' | 'rowsWithWarnings' | 'newOffices' | 'rosterVersion'
  >,
) {
  await db
    .updateTable('rosterImportDrafts')
    .set({
      mapping: JSON.stringify(preview.mapping),
      counts: JSON.stringify(preview.counts),
      rowsWithWarnings: preview.rowsWithWarnings,
      newOffices: JSON.stringify(preview.newOffices),
      rosterVersion: preview.rosterVersion,
    })
    .where('id', '=', draftId)
    .execute();
}

export async function findDraft(
  db: Db,
  clientId: string,
  draftId: string,
  options: { forUpdate?: boolean } = {},
): Promise<DraftRecord | undefined> {
  let query = db
    .selectFrom('rosterImportDrafts')
    .select([
      'id',
      'clientId',
      'fileName',
      'encoding',
      'hadByteOrderMark',
      'delimiter',
      'headers',
      'guessedColumns',
      'rowCount',
      'sampleRows',
      'mapping',
      'counts',
      'rowsWithWarnings',
      'newOffices',
      'rosterVersion',
      'expiresAt',
    ])
    .where('id', '=', draftId)
    .where('clientId', '=', clientId)
    .where('expiresAt', '>', sql<Date>`now()`);
  if (options.forUpdate) query = query.forUpdate();
  const row = await query.executeTakeFirst();
  if (!row) return undefined;
  return {
    ...row,
    mapping: row.mapping as ColumnMapping,
    counts: row.counts as PreviewCounts,
  };
}

/** The uploader's own draft for the client still open, if any (an upload replaces the last). */
export async function findOpenDraftId(
  db: Db,
  clientId: string,
  uploaderId: string,
): Promise<string | undefined> {
  const row = await db
    .selectFrom('rosterImportDrafts')
    .select('id')
    .where('clientId', '=', clientId)
    .where('createdBy', '=', uploaderId)
    .where('expiresAt', '>', sql<Date>`now()`)
    .orderBy('createdAt', 'desc')
    .limit(1)
    .executeTakeFirst();
  return row?.id;
}

/**
 * Stores the draft's uploaded file as it came. A Buffer travels as a binary parameter: no
 * text to build here nor to check there. Written in the upload's transaction before the draft
 * row exists (the reference is checked at commit).
 */
export async function insertDraftFile(db: Db, draftId: string, bytes: Uint8Array) {
  await db
    .insertInto('rosterImportFiles')
    .values({ draftId, bytes: Buffer.from(bytes.buffer, bytes.byteOffset, bytes.byteLength) })
    .execute();
}

/**
 * The file as stored for a remap or the rows-to-fix download: its bytes (parsed again by the
 * service), or, for a draft from before roster_import_files, its rows as JSON with what
 * decoding changed in them and their rows in the file when blank lines shifted them (see
 * ParsedRosterFile).
 */
export async function loadStoredFile(
  db: Db,
  draftId: string,
): Promise<
  | { bytes: Buffer }
  | { rawRows: string[][]; warnings: DecodeWarning[]; rowNumbers: number[] | null }
> {
  const row = await db
    .selectFrom('rosterImportDrafts')
    .leftJoin('rosterImportFiles', 'rosterImportFiles.draftId', 'rosterImportDrafts.id')
    .select(['rosterImportFiles.bytes', 'rawRows', 'decodeWarnings', 'rowNumbers'])
    .where('id', '=', draftId)
    .executeTakeFirstOrThrow();
  if (row.bytes) return { bytes: row.bytes };
  return { rawRows: row.rawRows ?? [], warnings: row.decodeWarnings, rowNumbers: row.rowNumbers };
}

export async function deleteDraft(db: Db, draftId: string) {
  await db.deleteFrom('rosterImportRows').where('draftId', '=', draftId).execute();
  await db.deleteFrom('rosterImportDrafts').where('id', '=', draftId).execute();
}
