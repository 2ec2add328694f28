import type { Db } from '../../db/database';
import { AppError } from '../../lib/errors';
import { isTimeZone, type PreviewRow, type PreviewValues } from '../../schemas/roster';
import * as repo from './roster.repository';

interface ApplyInput {
  officeTimeZones: Record<string, string>;
  deactivateMissing: boolean;
}

/**
 * The writes of one import, inside the caller's transaction: new offices, new people, changed
 * people, missing people made inactive (never deleted: their bookings and photos stay).
 */
export async function applyImport(
  trx: Db,
  clientId: string,
  draft: repo.DraftRecord,
  input: ApplyInput,
) {
  const zones = new Map(
    Object.entries(input.officeTimeZones).map(([name, zone]) => [name.trim().toLowerCase(), zone]),
  );
  const missingZones = draft.newOffices.filter((name) => {
    const zone = zones.get(name.toLowerCase());
    return !zone || !isTimeZone(zone);
  });
  if (missingZones.length > 0) {
    throw new AppError('office_time_zone_needed', 400, 'Confirm a time zone for each new office.', {
      fieldErrors: Object.fromEntries(
        missingZones.map((name) => [`office:${name}`, [`Choose the time zone of ${name}.`]]),
      ),
    });
  }
  const created = await repo.insertOffices(
    trx,
    clientId,
    draft.newOffices.map((name) => ({ name, timeZone: zones.get(name.toLowerCase()) ?? 'UTC' })),
  );
  const offices = [...(await repo.listOffices(trx, clientId))];
  const officeIds = new Map(offices.map((office) => [office.name.toLowerCase(), office.id]));

  const rows = await repo.previewRowsOfKinds(trx, draft.id, ['add', 'update', 'missing']);
  const toWrite = (row: PreviewRow): repo.PersonWrite => {
    const values: PreviewValues = row.values;
    return {
      id: row.personId,
      givenName: values.givenName ?? '',
      familyName: values.familyName ?? '',
      preferredName: values.preferredName ?? null,
      email: values.email ?? '',
      employeeId: values.employeeId ?? null,
      department: values.department ?? null,
      jobTitle: values.jobTitle ?? null,
      officeId: values.office ? (officeIds.get(values.office.toLowerCase()) ?? null) : null,
      extras: values.extras ?? {},
    };
  };
  const additions = rows.filter((row) => row.kind === 'add').map(toWrite);
  const updates = rows.filter((row) => row.kind === 'update').map(toWrite);
  const missing = rows.filter((row) => row.kind === 'missing').flatMap((row) => row.personId ?? []);

  try {
    await repo.insertPeople(trx, clientId, additions);
    await repo.updatePeople(trx, clientId, updates);
  } catch (error) {
    if (isUniqueViolation(error)) {
      throw new AppError(
        'roster_conflict',
        409,
        'Two people would end up with the same e-mail or employee id. Nothing was saved; check the file and try again.',
      );
    }
    throw error;
  }
  if (input.deactivateMissing) await repo.deactivatePeople(trx, clientId, missing);
  return {
    added: additions.length,
    updated: updates.length,
    unchanged: draft.counts.unchanged,
    deactivated: input.deactivateMissing ? missing.length : 0,
    skipped: draft.counts.error,
    officesCreated: created.length,
  };
}

function isUniqueViolation(error: unknown): boolean {
  return typeof error === 'object' && error !== null && 'code' in error && error.code === '23505';
}
