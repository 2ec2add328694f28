import { sql, type Selectable } from 'kysely';
import type { Db } from '../../db/database';
import type { RosterImportRowsTable } from '../../db/roster-types';
import type { PreviewPage, PreviewRow, RosterField } from '../../schemas/roster';

/** The rows of a draft's preview: stored once per upload or remap, then paged for the table. */

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
      (row.kind === 'add' || row.kind === 'unchanged') && Object.keys(row.warnings).length === 0
        ? null
        : JSON.stringify({
            before: row.before,
            changedFields: row.changedFields,
            errors: row.errors,
            warnings: row.warnings,
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
    warnings: detail?.warnings ?? {},
  };
}

const hasWarnings = sql<boolean>`coalesce(detail -> 'warnings', '{}'::jsonb) <> '{}'::jsonb`;

export async function countRowsWithWarnings(db: Db, draftId: string): Promise<number> {
  const row = await db
    .selectFrom('rosterImportRows')
    .select((eb) => eb.fn.countAll<string>().as('n'))
    .where('draftId', '=', draftId)
    .where(hasWarnings)
    .executeTakeFirstOrThrow();
  return Number(row.n);
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
  if (query.kind === 'warned') base = base.where(hasWarnings);
  else if (query.kind !== 'all') base = base.where('kind', '=', query.kind as PreviewRow['kind']);
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
