import type { Db } from '../../db/database';
import { AppError } from '../../lib/errors';
import { isTimeZone } from '../../schemas/roster';
import * as writes from './roster-import.repository';
import type { DraftRecord } from './roster.repository';

interface ApplyInput {
  officeTimeZones: Record<string, string>;
  deactivateMissing: boolean;
  rekeyConflicts: boolean;
}

/**
 * The writes of one import, inside the caller's transaction: new offices, new people, changed
 * people, missing people made inactive (never deleted: their bookings and photos stay).
 */
export async function applyImport(
  trx: Db,
  clientId: string,
  draft: DraftRecord,
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
  const created = await writes.insertOffices(
    trx,
    clientId,
    draft.newOffices.map((name) => ({ name, timeZone: zones.get(name.toLowerCase()) ?? 'UTC' })),
  );
  let added: number;
  let updated: number;
  try {
    added = await writes.insertPreviewedPeople(trx, clientId, draft.id);
    updated = await writes.updatePreviewedPeople(
      trx,
      clientId,
      draft.id,
      input.rekeyConflicts ? ['update', 'conflict'] : ['update'],
    );
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
  const deactivated = input.deactivateMissing
    ? await writes.deactivateMissingPeople(trx, clientId, draft.id)
    : 0;
  return {
    added,
    updated,
    unchanged: draft.counts.unchanged,
    deactivated,
    // Conflicts not confirmed are left out like rows in error.
    skipped: draft.counts.error + (input.rekeyConflicts ? 0 : (draft.counts.conflict ?? 0)),
    officesCreated: created.length,
  };
}

function isUniqueViolation(error: unknown): boolean {
  return typeof error === 'object' && error !== null && 'code' in error && error.code === '23505';
}
