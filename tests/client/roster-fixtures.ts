import type { RosterDraft } from '../../server/schemas/roster';

/** A two-person draft whose columns are known: what the preview step and the wizard are given. */
export const sampleDraft: RosterDraft = {
  id: '00000000-0000-4000-8000-000000000001',
  fileName: 'staff.csv',
  encoding: 'utf-8',
  delimiter: ',',
  rowCount: 2,
  headers: ['First name', 'Last name', 'E-mail'],
  guessedColumns: [],
  sampleRows: [],
  mapping: ['givenName', 'familyName', 'email'],
  mappingProblems: [],
  mappingRemembered: true,
  counts: { add: 2, update: 0, conflict: 0, unchanged: 0, error: 0, missing: 1 },
  rowsWithWarnings: 0,
  newOffices: [],
  knownOffices: [],
  expiresAt: '2026-12-03T10:00:00.000Z',
};

export const jsonResponse = (status: number, body: unknown) =>
  new Response(JSON.stringify(body), { status, headers: { 'Content-Type': 'application/json' } });
