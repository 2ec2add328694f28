import { sql, type Selectable } from 'kysely';
import { hasKeys } from '../../lib/has-keys';
import { copyRows, type CopyValue } from '../../db/copy-rows';
import type { Db } from '../../db/database';
import type { RosterImportRowsTable } from '../../db/roster-types';
import { rosterFields, type PreviewPage, type PreviewRow } from '../../schemas/roster';

/** The rows of a draft's preview: stored once per upload or remap, then paged for the table. */

const columnOf = (field: string) => field.replace(/[A-Z]/g, (letter) => `_${letter.toLowerCase()}`);

/** In the order replacePreviewRows writes each record; the fields' columns follow rosterFields. */
const storedColumns = [
  'draft_id',
  'position',
  'row_number',
  'kind',
  'person_id',
  ...rosterFields.map(columnOf),
  'extras',
  'detail',
  'active',
];

/**
 * Replaces the draft's preview rows, written with COPY (copy-rows.ts): at 50,000 rows that is
 * half the time of batched unnest inserts, most of which went into building and reading array
 * literals.
 */
export async function replacePreviewRows(db: Db, draftId: string, rows: Iterable<PreviewRow>) {
  await db.deleteFrom('rosterImportRows').where('draftId', '=', draftId).execute();
  await copyRows(db, 'roster_import_rows', storedColumns, rows, (row) => {
    const extras = row.values.extras;
    const detail =
      (row.kind === 'add' || row.kind === 'unchanged') && !hasKeys(row.warnings)
        ? null
        : JSON.stringify({
            before: row.before,
            changedFields: row.changedFields,
            errors: row.errors,
            warnings: row.warnings,
          });
    // Filled in place rather than spread from a mapped array: two arrays fewer per row.
    const record = new Array<CopyValue>(storedColumns.length);
    record[0] = draftId;
    record[1] = row.position;
    record[2] = row.rowNumber;
    record[3] = row.kind;
    record[4] = row.personId;
    // Named one by one (in rosterFields' order, as storedColumns): a read by a computed name
    // was the slowest line of this function.
    const values = row.values;
    record[5] = values.givenName ?? null;
    record[6] = values.familyName ?? null;
    record[7] = values.preferredName ?? null;
    record[8] = values.email ?? null;
    record[9] = values.employeeId ?? null;
    record[10] = values.department ?? null;
    record[11] = values.jobTitle ?? null;
    record[12] = values.office ?? null;
    record[5 + rosterFields.length] = extras && hasKeys(extras) ? JSON.stringify(extras) : null;
    record[6 + rosterFields.length] = detail;
    // Error rows say nothing (their values are the cells as read); missing people are false.
    record[7 + rosterFields.length] = row.kind === 'error' ? null : (row.values.active ?? null);
    return record;
  });
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
  'active',
  'extras',
  'detail',
] as const;

type StoredPreviewRow = Pick<Selectable<RosterImportRowsTable>, (typeof previewColumns)[number]>;

function toPreviewRow(row: StoredPreviewRow): PreviewRow {
  const { position, rowNumber, kind, personId, extras, detail, active, ...values } = row;
  return {
    position,
    rowNumber,
    kind,
    personId,
    values: { ...values, extras: extras ?? {}, active: active ?? kind !== 'missing' },
    before: (detail?.before as PreviewRow['before']) ?? null,
    changedFields: detail?.changedFields ?? [],
    errors: detail?.errors ?? {},
    warnings: detail?.warnings ?? {},
  };
}

const hasWarnings = sql<boolean>`coalesce(detail -> 'warnings', '{}'::jsonb) <> '{}'::jsonb`;

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
        eb('employeeId', 'ilike', pattern),
        eb('preferredName', 'ilike', pattern),
        eb(sql<string>`given_name || ' ' || family_name`, 'ilike', pattern),
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
