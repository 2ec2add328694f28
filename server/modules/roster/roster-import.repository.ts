import { sql } from 'kysely';
import type { Db } from '../../db/database';
import type { ImportSummary } from '../../schemas/roster';
import type { OfficeRecord } from './roster.repository';

/**
 * The writes of a commit. People are written straight from the stored preview rows in SQL, so
 * a 50,000-row import never travels back through Node and commit applies exactly what was shown.
 */

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

type WrittenKind = 'add' | 'update' | 'conflict';

/** The previewed values of some kinds of row, with the office resolved to the client's office. */
const previewValues = (clientId: string, draftId: string, kinds: readonly WrittenKind[]) => sql`
  select r.person_id, r.position, r.given_name, r.family_name, r.preferred_name, r.email,
         r.employee_id, r.department, r.job_title, o.id as office_id,
         coalesce(r.extras, '{}') as extras, coalesce(r.active, true) as active
  from roster_import_rows r
  left join offices o on o.client_id = ${clientId}::uuid and lower(o.name) = lower(r.office)
  where r.draft_id = ${draftId}::uuid and r.kind = any(${kinds}::text[])`;

export async function insertPreviewedPeople(db: Db, clientId: string, draftId: string) {
  const result = await sql`
    insert into people (client_id, given_name, family_name, preferred_name, email, employee_id,
                        department, job_title, office_id, extras, active)
    select ${clientId}::uuid, given_name, family_name, preferred_name, email, employee_id,
           department, job_title, office_id, extras, active
    from (${previewValues(clientId, draftId, ['add'])}) as added`.execute(db);
  return Number(result.numAffectedRows ?? 0);
}

/** Updates, and conflicts when the coordinator confirmed they are the same people. */
export async function updatePreviewedPeople(
  db: Db,
  clientId: string,
  draftId: string,
  kinds: readonly WrittenKind[],
) {
  const result = await sql`
    update people as p set
      given_name = u.given_name, family_name = u.family_name, preferred_name = u.preferred_name,
      email = u.email, employee_id = u.employee_id, department = u.department,
      job_title = u.job_title, office_id = u.office_id, extras = u.extras,
      active = u.active, updated_at = now()
    from (${previewValues(clientId, draftId, kinds)}) as u
    where p.id = u.person_id and p.client_id = ${clientId}::uuid`.execute(db);
  return Number(result.numAffectedRows ?? 0);
}

/** Missing people become inactive, never deleted: their bookings and photos stay. */
export async function deactivateMissingPeople(db: Db, clientId: string, draftId: string) {
  const result = await sql`
    update people set active = false, updated_at = now()
    where client_id = ${clientId}::uuid and active
      and id in (select person_id from roster_import_rows
                 where draft_id = ${draftId}::uuid and kind = 'missing')`.execute(db);
  return Number(result.numAffectedRows ?? 0);
}

export async function insertImport(
  db: Db,
  entry: Omit<ImportSummary, 'id' | 'importedAt' | 'importedBy'> & {
    clientId: string;
    importedBy: string | null;
    draftId: string;
  },
): Promise<string> {
  const row = await db
    .insertInto('rosterImports')
    .values(entry)
    .returning('id')
    .executeTakeFirstOrThrow();
  return row.id;
}

export async function listImports(
  db: Db,
  clientId: string,
  only: { draftId?: string } = {},
): Promise<ImportSummary[]> {
  let query = db
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
    .where('rosterImports.clientId', '=', clientId);
  if (only.draftId) query = query.where('rosterImports.draftId', '=', only.draftId);
  const rows = await query.orderBy('rosterImports.importedAt', 'desc').limit(20).execute();
  return rows.map((row) => ({ ...row, importedAt: new Date(row.importedAt).toISOString() }));
}
