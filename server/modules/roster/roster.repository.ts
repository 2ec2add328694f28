import { sql } from 'kysely';
import type { Db } from '../../db/database';
import type {
  ColumnMapping,
  ImportSummary,
  PreviewCounts,
  PreviewPage,
  PreviewRow,
} from '../../schemas/roster';
import type { ExistingPerson } from './roster-diff';

export interface DraftRecord {
  id: string;
  clientId: string;
  fileName: string;
  encoding: string;
  delimiter: string;
  headers: string[];
  rawRows: string[][];
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
  await db
    .deleteFrom('rosterImportDrafts')
    .where((eb) => eb.or([eb('clientId', '=', clientId), eb('expiresAt', '<', sql<Date>`now()`)]))
    .execute();
}

export async function insertDraft(
  db: Db,
  draft: Omit<DraftRecord, 'id'> & { createdBy: string | null },
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
export async function replacePreviewRows(db: Db, draftId: string, rows: readonly PreviewRow[]) {
  await db.deleteFrom('rosterImportRows').where('draftId', '=', draftId).execute();
  if (rows.length === 0) return;
  const payload = JSON.stringify(
    rows.map((row) => ({
      position: row.position,
      rowNumber: row.rowNumber,
      kind: row.kind,
      personId: row.personId,
      sortName: `${row.values.familyName ?? ''} ${row.values.givenName ?? ''}`.trim(),
      email: row.values.email ?? '',
      data: row,
    })),
  );
  await sql`
    insert into roster_import_rows (draft_id, position, row_number, kind, person_id, sort_name, email, data)
    select ${draftId}::uuid, r.position, r."rowNumber", r.kind, r."personId", r."sortName", r.email, r.data
    from jsonb_to_recordset(${payload}::jsonb) as r(
      position int, "rowNumber" int, kind text, "personId" uuid, "sortName" text, email text, data jsonb
    )`.execute(db);
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
      'rawRows',
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
      eb.or([eb('sortName', 'ilike', pattern), eb('email', 'ilike', pattern)]),
    );
  }
  const column = ({ name: 'sortName', email: 'email', kind: 'kind' } as const)[
    query.sort as 'name' | 'email' | 'kind'
  ];
  let rowsQuery = base.select('data');
  if (column) rowsQuery = rowsQuery.orderBy(column, query.direction);
  const rows = await rowsQuery
    .orderBy('position', column ? 'asc' : query.direction)
    .limit(query.pageSize)
    .offset((query.page - 1) * query.pageSize)
    .execute();
  const total = await base
    .select((eb) => eb.fn.countAll<string>().as('n'))
    .executeTakeFirstOrThrow();
  return {
    rows: rows.map((row) => row.data as PreviewRow),
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
    .select('data')
    .where('draftId', '=', draftId)
    .where('kind', 'in', kinds)
    .orderBy('position')
    .execute();
  return rows.map((row) => row.data as PreviewRow);
}

export async function deleteDraft(db: Db, draftId: string) {
  await db.deleteFrom('rosterImportDrafts').where('id', '=', draftId).execute();
}

export async function insertOffices(
  db: Db,
  clientId: string,
  offices: ReadonlyArray<{ name: string; timeZone: string }>,
): Promise<OfficeRecord[]> {
  if (offices.length === 0) return [];
  return db
    .insertInto('offices')
    .values(offices.map((office) => ({ clientId, ...office })))
    .returning(['id', 'name', 'timeZone'])
    .execute();
}

export interface PersonWrite {
  id?: string | null;
  givenName: string;
  familyName: string;
  preferredName: string | null;
  email: string;
  employeeId: string | null;
  department: string | null;
  jobTitle: string | null;
  officeId: string | null;
  extras: Record<string, string>;
}

/** All new people in one statement: the roster can be 50,000 rows. */
export async function insertPeople(db: Db, clientId: string, people: readonly PersonWrite[]) {
  if (people.length === 0) return;
  await sql`
    insert into people (client_id, given_name, family_name, preferred_name, email, employee_id,
                        department, job_title, office_id, extras)
    select ${clientId}::uuid, r."givenName", r."familyName", r."preferredName", r.email,
           r."employeeId", r.department, r."jobTitle", r."officeId", coalesce(r.extras, '{}')
    from jsonb_to_recordset(${JSON.stringify(people)}::jsonb) as r(
      "givenName" text, "familyName" text, "preferredName" text, email text, "employeeId" text,
      department text, "jobTitle" text, "officeId" uuid, extras jsonb
    )`.execute(db);
}

export async function updatePeople(db: Db, clientId: string, people: readonly PersonWrite[]) {
  if (people.length === 0) return;
  await sql`
    update people as p set
      given_name = r."givenName", family_name = r."familyName", preferred_name = r."preferredName",
      email = r.email, employee_id = r."employeeId", department = r.department,
      job_title = r."jobTitle", office_id = r."officeId", extras = coalesce(r.extras, '{}'),
      active = true, updated_at = now()
    from jsonb_to_recordset(${JSON.stringify(people)}::jsonb) as r(
      id uuid, "givenName" text, "familyName" text, "preferredName" text, email text,
      "employeeId" text, department text, "jobTitle" text, "officeId" uuid, extras jsonb
    )
    where p.id = r.id and p.client_id = ${clientId}::uuid`.execute(db);
}

export async function deactivatePeople(db: Db, clientId: string, ids: readonly string[]) {
  if (ids.length === 0) return;
  await db
    .updateTable('people')
    .set({ active: false, updatedAt: sql`now()` })
    .where('clientId', '=', clientId)
    .where('id', '=', sql<string>`any(${ids}::uuid[])`)
    .execute();
}

export async function insertImport(
  db: Db,
  entry: Omit<ImportSummary, 'id' | 'importedAt' | 'importedBy'> & {
    clientId: string;
    importedBy: string | null;
  },
): Promise<string> {
  const row = await db
    .insertInto('rosterImports')
    .values(entry)
    .returning('id')
    .executeTakeFirstOrThrow();
  return row.id;
}

export async function listImports(db: Db, clientId: string): Promise<ImportSummary[]> {
  const rows = await db
    .selectFrom('rosterImports')
    .leftJoin('users', 'users.id', 'rosterImports.importedBy')
    .select([
      'rosterImports.id',
      'rosterImports.fileName',
      'rosterImports.importedAt',
      'users.displayName as importedBy',
      'rosterImports.added',
      'rosterImports.updated',
      'rosterImports.unchanged',
      'rosterImports.deactivated',
      'rosterImports.skipped',
      'rosterImports.officesCreated',
    ])
    .where('rosterImports.clientId', '=', clientId)
    .orderBy('rosterImports.importedAt', 'desc')
    .limit(20)
    .execute();
  return rows.map((row) => ({ ...row, importedAt: new Date(row.importedAt).toISOString() }));
}
