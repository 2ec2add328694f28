import { sql, type Selectable } from 'kysely';
import type { Db } from '../../db/database';
import type { RosterImportRowsTable } from '../../db/roster-types';
import type {
  ColumnMapping,
  PreviewCounts,
  PreviewPage,
  PreviewRow,
  RosterField,
} from '../../schemas/roster';
import type { ExistingPerson } from './roster-diff';

export interface DraftRecord {
  id: string;
  clientId: string;
  fileName: string;
  encoding: string;
  delimiter: string;
  headers: string[];
  rowCount: number;
  sampleRows: string[][];
  mapping: ColumnMapping;
  counts: PreviewCounts;
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

/** One open draft per client: a new upload replaces the last; expired ones go too. */
export async function deleteStaleDrafts(db: Db, clientId: string): Promise<void> {
  const stale = await db
    .deleteFrom('rosterImportDrafts')
    .where((eb) => eb.or([eb('clientId', '=', clientId), eb('expiresAt', '<', sql<Date>`now()`)]))
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
  draft: Omit<DraftRecord, 'id' | 'rowCount' | 'sampleRows'> & {
    createdBy: string | null;
    rawRows: string[][];
  },
): Promise<string> {
  const row = await db
    .insertInto('rosterImportDrafts')
    .values({
      clientId: draft.clientId,
      createdBy: draft.createdBy,
      fileName: draft.fileName,
      encoding: draft.encoding,
      delimiter: draft.delimiter,
      headers: JSON.stringify(draft.headers),
      rawRows: JSON.stringify(draft.rawRows),
      mapping: JSON.stringify(draft.mapping),
      counts: JSON.stringify(draft.counts),
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
  preview: Pick<DraftRecord, 'mapping' | 'counts' | 'newOffices' | 'rosterVersion'>,
) {
  await db
    .updateTable('rosterImportDrafts')
    .set({
      mapping: JSON.stringify(preview.mapping),
      counts: JSON.stringify(preview.counts),
      newOffices: JSON.stringify(preview.newOffices),
      rosterVersion: preview.rosterVersion,
    })
    .where('id', '=', draftId)
    .execute();
}

/** Replaces the draft's preview rows in one statement (one JSON parameter, any row count). */
/**
 * Replaces the draft's preview rows. Columns travel as parallel arrays (unnest) in batches:
 * PostgreSQL reads that far faster than one JSON document per row.
 */
export async function replacePreviewRows(db: Db, draftId: string, rows: readonly PreviewRow[]) {
  await db.deleteFrom('rosterImportRows').where('draftId', '=', draftId).execute();
  const text = (batch: readonly PreviewRow[], field: RosterField) =>
    batch.map((row) => row.values[field] ?? null);
  for (let start = 0; start < rows.length; start += 5000) {
    const batch = rows.slice(start, start + 5000);
    const extras = batch.map((row) =>
      row.values.extras && Object.keys(row.values.extras).length > 0
        ? JSON.stringify(row.values.extras)
        : null,
    );
    const detail = batch.map((row) =>
      row.kind === 'add' || row.kind === 'unchanged'
        ? null
        : JSON.stringify({
            before: row.before,
            changedFields: row.changedFields,
            errors: row.errors,
          }),
    );
    await sql`
      insert into roster_import_rows (draft_id, position, row_number, kind, person_id, given_name,
        family_name, preferred_name, email, employee_id, department, job_title, office, extras, detail)
      select ${draftId}::uuid, * from unnest(
        ${batch.map((row) => row.position)}::int[],
        ${batch.map((row) => row.rowNumber)}::int[],
        ${batch.map((row) => row.kind)}::text[],
        ${batch.map((row) => row.personId)}::uuid[],
        ${text(batch, 'givenName')}::text[], ${text(batch, 'familyName')}::text[],
        ${text(batch, 'preferredName')}::text[], ${text(batch, 'email')}::text[],
        ${text(batch, 'employeeId')}::text[], ${text(batch, 'department')}::text[],
        ${text(batch, 'jobTitle')}::text[], ${text(batch, 'office')}::text[],
        ${extras}::jsonb[], ${detail}::jsonb[]
      )`.execute(db);
  }
}

const previewColumns = [
  'position',
  'rowNumber',
  'kind',
  'personId',
  'givenName',
  'familyName',
  'preferredName',
  'email',
  'employeeId',
  'department',
  'jobTitle',
  'office',
  'extras',
  'detail',
] as const;

type StoredPreviewRow = Pick<Selectable<RosterImportRowsTable>, (typeof previewColumns)[number]>;

function toPreviewRow(row: StoredPreviewRow): PreviewRow {
  const { position, rowNumber, kind, personId, extras, detail, ...values } = row;
  return {
    position,
    rowNumber,
    kind,
    personId,
    values: { ...values, extras: extras ?? {}, active: kind !== 'missing' },
    before: (detail?.before as PreviewRow['before']) ?? null,
    changedFields: detail?.changedFields ?? [],
    errors: detail?.errors ?? {},
  };
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
      'delimiter',
      'headers',
      sql<number>`jsonb_array_length(raw_rows)`.as('rowCount'),
      sql<string[][]>`jsonb_path_query_array(raw_rows, '$[0 to 2]')`.as('sampleRows'),
      'mapping',
      'counts',
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

/** The file's rows as uploaded: only remapping and the error download need them. */
export async function loadRawRows(db: Db, draftId: string): Promise<string[][]> {
  const row = await db
    .selectFrom('rosterImportDrafts')
    .select('rawRows')
    .where('id', '=', draftId)
    .executeTakeFirstOrThrow();
  return row.rawRows;
}

export async function previewPage(
  db: Db,
  draftId: string,
  query: {
    kind: string;
    page: number;
    pageSize: number;
    sort: string;
    direction: 'asc' | 'desc';
    q: string;
  },
): Promise<PreviewPage> {
  let base = db.selectFrom('rosterImportRows').where('draftId', '=', draftId);
  if (query.kind !== 'all') base = base.where('kind', '=', query.kind as PreviewRow['kind']);
  if (query.q) {
    const pattern = `%${query.q.replace(/[\\%_]/g, (match) => `\\${match}`)}%`;
    base = base.where((eb) =>
      eb.or([
        eb('givenName', 'ilike', pattern),
        eb('familyName', 'ilike', pattern),
        eb('email', 'ilike', pattern),
      ]),
    );
  }
  const columns = (
    {
      name: ['familyName', 'givenName'],
      email: ['email'],
      kind: ['kind'],
      position: [],
    } as const
  )[query.sort as 'name' | 'email' | 'kind' | 'position'];
  let rowsQuery = base.select(previewColumns);
  for (const column of columns) rowsQuery = rowsQuery.orderBy(column, query.direction);
  const rows = await rowsQuery
    .orderBy('position', columns.length > 0 ? 'asc' : query.direction)
    .limit(query.pageSize)
    .offset((query.page - 1) * query.pageSize)
    .execute();
  const total = await base
    .select((eb) => eb.fn.countAll<string>().as('n'))
    .executeTakeFirstOrThrow();
  return {
    rows: rows.map(toPreviewRow),
    total: Number(total.n),
    page: query.page,
    pageSize: query.pageSize,
  };
}

export async function previewRowsOfKinds(
  db: Db,
  draftId: string,
  kinds: readonly PreviewRow['kind'][],
): Promise<PreviewRow[]> {
  const rows = await db
    .selectFrom('rosterImportRows')
    .select(previewColumns)
    .where('draftId', '=', draftId)
    .where('kind', 'in', kinds)
    .orderBy('position')
    .execute();
  return rows.map(toPreviewRow);
}

export async function deleteDraft(db: Db, draftId: string) {
  await db.deleteFrom('rosterImportRows').where('draftId', '=', draftId).execute();
  await db.deleteFrom('rosterImportDrafts').where('id', '=', draftId).execute();
}
