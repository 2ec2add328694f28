import { randomUUID } from 'node:crypto';
import { hasKeys } from '../../lib/has-keys';
import type { Db } from '../../db/database';
import { recordAudit } from '../../lib/audit';
import { AppError, notFound } from '../../lib/errors';
import type { Viewer } from '../../lib/viewer';
import {
  columnMappingSchema,
  commitImportRequestSchema,
  previewQuerySchema,
  type ColumnMapping,
  type ColumnTarget,
  type CommitImportRequest,
  type ImportSummary,
  type PreviewCounts,
  type PreviewQuery,
  type PreviewRow,
  type RosterDraft,
  type RosterField,
} from '../../schemas/roster';
import { assertClientAccess } from './client-access';
import {
  fixColumnHeader,
  isFixColumn,
  mappingToRemember,
  normaliseHeader,
  suggestMapping,
} from './column-mapping';
import type { DecodeWarning } from '../../db/roster-types';
import { cleanCell, parseRosterFile } from './csv-decode';
import { rowsToFixFile } from './rows-to-fix-csv';
import { createRosterDiff } from './roster-diff';
import { createRowChecker } from './roster-rows';
import * as previewRepo from './roster-preview.repository';
import * as repo from './roster.repository';
import { insertImport, listImports } from './roster-import.repository';
import { applyImport } from './apply-import';

export type RosterService = ReturnType<typeof createRosterService>;

const draftLifetimeMs = 24 * 60 * 60 * 1000;

/**
 * A draft ends when it is saved (asking to save it again answers with its import), when its
 * uploader sends a newer file for the client, or when it expires.
 */
const draftGone = () =>
  new AppError(
    'not_found',
    404,
    'This import is no longer open: it was saved, replaced by a newer upload of yours, or kept past its 24 hours. See the earlier imports below, or upload the file again.',
  );

export function mappingProblems(mapping: ColumnMapping): string[] {
  const result = columnMappingSchema.safeParse(mapping);
  return result.success ? [] : result.error.issues.map((issue) => issue.message);
}

const noCounts = (): PreviewCounts => ({
  add: 0,
  update: 0,
  conflict: 0,
  unchanged: 0,
  error: 0,
  missing: 0,
});

interface DecodedFile {
  headers: string[];
  encoding: string;
  warnings: readonly DecodeWarning[];
  rowNumbers: readonly number[] | null;
}

/** What a preview is diffed against: the roster as it is now. Reads only. */
async function rosterNow(db: Db, clientId: string, mapping: ColumnMapping) {
  const version = await repo.rosterVersion(db, clientId);
  // An unfinished mapping previews nothing until it is finished.
  if (mappingProblems(mapping).length > 0) return { version, diffed: null };
  const [existing, offices] = await Promise.all([
    repo.loadRoster(db, clientId),
    repo.listOffices(db, clientId),
  ]);
  return { version, diffed: { existing, offices } };
}

type RosterNow = Awaited<ReturnType<typeof rosterNow>>;

/**
 * Parses the upload while PostgreSQL stores its bytes for the draft `id`: the insert goes out
 * on the socket before the parse takes the thread, so the two overlap (about 20 ms at 50,000
 * rows). A refused file rolls the transaction back, bytes and all.
 */
async function parsedWhileStored(trx: Db, id: string, bytes: Uint8Array) {
  const stored = repo.insertDraftFile(trx, id, bytes);
  // One turn of the event loop: the query's promise chain runs and pg writes it.
  await new Promise((resolve) => setImmediate(resolve));
  let parsed: ReturnType<typeof parseRosterFile>;
  try {
    parsed = parseRosterFile(bytes);
  } catch (error) {
    await stored.catch(() => undefined);
    throw error;
  }
  await stored;
  return parsed;
}

/**
 * A draft's file as uploaded: its bytes parsed again (the same bytes give the same rows). A
 * draft read by an earlier version of the rules, which now read it otherwise or refuse it,
 * is not guessed at: the file is to be uploaded again.
 */
async function storedFile(db: Db, draft: repo.DraftRecord) {
  const stored = await repo.loadStoredFile(db, draft.id);
  if (!('bytes' in stored)) return stored;
  const readAgain = () => {
    try {
      return parseRosterFile(stored.bytes);
    } catch (error) {
      if (error instanceof AppError) return null;
      throw error;
    }
  };
  const parsed = readAgain();
  if (!parsed || parsed.headers.join('\u0000') !== draft.headers.join('\u0000')) {
    throw new AppError(
      'draft_read_otherwise',
      409,
      'Likeness now reads this file differently from when it was uploaded. Upload the file again to check it.',
    );
  }
  return { rawRows: parsed.rows, warnings: parsed.warnings, rowNumbers: parsed.rowNumbers };
}

interface PreviewSummary {
  counts: PreviewCounts;
  rowsWithWarnings: number;
  newOffices: string[];
}

/**
 * The preview rows of a file, each checked and diffed against the roster only when the COPY
 * storing them asks for it, so PostgreSQL stores one chunk while the next is worked out;
 * `summary` is complete once the last row has been taken.
 */
function* previewRows(
  file: DecodedFile,
  rawRows: readonly (readonly string[])[],
  mapping: ColumnMapping,
  roster: RosterNow,
  summary: PreviewSummary,
): Generator<PreviewRow> {
  if (!roster.diffed) return;
  const check = createRowChecker(file.headers, mapping, file.warnings, file.rowNumbers);
  const mapped = new Set(
    mapping.filter((target) => target !== 'extra' && target !== 'ignore' && target !== 'status'),
  );
  const diff = createRosterDiff(
    roster.diffed.existing,
    roster.diffed.offices.map((office) => office.name),
    mapped as Set<RosterField>,
    mapping.includes('extra'),
    { legacyEncoding: file.encoding === 'windows-1252' },
  );
  const tally = (row: PreviewRow) => {
    summary.counts[row.kind] += 1;
    if (hasKeys(row.warnings)) summary.rowsWithWarnings += 1;
    return row;
  };
  for (let index = 0; index < rawRows.length; index += 1) {
    yield tally(diff.next(check(rawRows[index] ?? [], index)));
  }
  const end = diff.finish();
  for (const row of end.missing) yield tally(row);
  summary.newOffices = end.newOffices;
}

/** Checks, diffs and stores the draft's preview rows in one pass; what they came to. */
async function storePreview(
  trx: Db,
  draftId: string,
  file: DecodedFile,
  rawRows: readonly (readonly string[])[],
  mapping: ColumnMapping,
  roster: RosterNow,
): Promise<PreviewSummary> {
  const summary: PreviewSummary = { counts: noCounts(), rowsWithWarnings: 0, newOffices: [] };
  await previewRepo.replacePreviewRows(
    trx,
    draftId,
    previewRows(file, rawRows, mapping, roster, summary),
  );
  return summary;
}

export function createRosterService(deps: { db: Db }) {
  const { db } = deps;

  async function view(clientId: string, draft: repo.DraftRecord): Promise<RosterDraft> {
    const saved = await repo.savedMapping(db, clientId);
    const mappingRemembered = draft.headers.every((header, index) => {
      const key = normaliseHeader(header);
      return key === '' || saved[key] === draft.mapping[index];
    });
    return {
      mappingRemembered,
      id: draft.id,
      fileName: draft.fileName,
      encoding: draft.encoding,
      delimiter: draft.delimiter,
      rowCount: draft.rowCount,
      headers: draft.headers,
      guessedColumns: draft.guessedColumns,
      sampleRows: draft.sampleRows,
      mapping: draft.mapping,
      mappingProblems: mappingProblems(draft.mapping),
      counts: draft.counts,
      rowsWithWarnings: draft.rowsWithWarnings,
      newOffices: draft.newOffices,
      knownOffices: await repo.listOffices(db, clientId),
      expiresAt: draft.expiresAt.toISOString(),
    };
  }

  async function draftOf(clientId: string, draftId: string, forUpdate = false) {
    const draft = await repo.findDraft(db, clientId, draftId, { forUpdate });
    if (!draft) throw draftGone();
    return draft;
  }

  return {
    /** Parses the upload and previews it with the suggested mapping. The roster is untouched. */
    async upload(viewer: Viewer, clientId: string, fileName: string, bytes: Uint8Array) {
      await assertClientAccess(db, viewer, clientId);
      // The name comes from the browser; PostgreSQL refuses a NUL in it like in any cell.
      const storedName = cleanCell(fileName).value.trim() || 'roster.csv';
      const id = randomUUID();
      const draft = await db.transaction().execute(async (trx) => {
        const parsed = await parsedWhileStored(trx, id, bytes);
        // Read on the transaction's own connection: one connection per upload.
        const saved = (await repo.savedMapping(trx, clientId)) as Record<string, ColumnTarget>;
        const mapping = suggestMapping(parsed.headers, saved, parsed.rows);
        const byHeaderOnly = suggestMapping(parsed.headers, saved);
        const guessedColumns = mapping.flatMap((target, index) =>
          target === byHeaderOnly[index] ? [] : [index],
        );
        const roster = await rosterNow(trx, clientId, mapping);
        await repo.deleteStaleDrafts(trx, clientId, viewer.id);
        // The preview rows go first (nothing refers to the draft row yet), so that counting
        // them is part of storing them.
        const preview = await storePreview(trx, id, parsed, parsed.rows, mapping, roster);
        const record = {
          clientId,
          rowCount: parsed.rows.length,
          sampleRows: parsed.rows.slice(0, 3),
          fileName: storedName,
          encoding: parsed.encoding,
          hadByteOrderMark: parsed.hadByteOrderMark,
          delimiter: parsed.delimiter,
          headers: parsed.headers,
          guessedColumns,
          mapping,
          counts: preview.counts,
          rowsWithWarnings: preview.rowsWithWarnings,
          newOffices: preview.newOffices,
          rosterVersion: roster.version,
          expiresAt: new Date(Date.now() + draftLifetimeMs),
        };
        await repo.insertDraft(trx, {
          ...record,
          id,
          rawRows: parsed.rows,
          rowNumbers: parsed.rowNumbers,
          decodeWarnings: parsed.warnings,
          createdBy: viewer.id,
        });
        return { id, ...record };
      });
      return view(clientId, draft);
    },

    /** The caller's own import of a file for this client not yet saved, to take up again. */
    async openDraft(viewer: Viewer, clientId: string): Promise<RosterDraft | null> {
      await assertClientAccess(db, viewer, clientId);
      const draftId = await repo.findOpenDraftId(db, clientId, viewer.id);
      const draft = draftId ? await repo.findDraft(db, clientId, draftId) : undefined;
      return draft ? view(clientId, draft) : null;
    },

    async get(viewer: Viewer, clientId: string, draftId: string) {
      await assertClientAccess(db, viewer, clientId);
      return view(clientId, await draftOf(clientId, draftId));
    },

    async remap(viewer: Viewer, clientId: string, draftId: string, mapping: ColumnMapping) {
      await assertClientAccess(db, viewer, clientId);
      const draft = await draftOf(clientId, draftId);
      if (mapping.length !== draft.headers.length) {
        throw new AppError('invalid_input', 400, 'Choose a target for every column of the file.');
      }
      const { rawRows, warnings, rowNumbers } = await storedFile(db, draft);
      const file = { headers: draft.headers, encoding: draft.encoding, warnings, rowNumbers };
      const roster = await rosterNow(db, clientId, mapping);
      const preview = await db.transaction().execute(async (trx) => {
        const summary = await storePreview(trx, draftId, file, rawRows, mapping, roster);
        await repo.updateDraftPreview(trx, draftId, {
          mapping,
          ...summary,
          rosterVersion: roster.version,
        });
        return summary;
      });
      return view(clientId, {
        ...draft,
        mapping,
        counts: preview.counts,
        rowsWithWarnings: preview.rowsWithWarnings,
        newOffices: preview.newOffices,
      });
    },

    async previewRows(viewer: Viewer, clientId: string, draftId: string, query: PreviewQuery) {
      await assertClientAccess(db, viewer, clientId);
      await draftOf(clientId, draftId);
      return previewRepo.previewPage(db, draftId, previewQuerySchema.parse(query));
    },

    /**
     * The rows in error or in conflict as CSV: the file's own columns plus what to fix, in the
     * file's own separator and encoding, ready to correct and upload again.
     */
    async errorCsv(viewer: Viewer, clientId: string, draftId: string) {
      await assertClientAccess(db, viewer, clientId);
      const draft = await draftOf(clientId, draftId);
      const errors = await previewRepo.previewRowsOfKinds(db, draftId, ['error', 'conflict']);
      const { rawRows } = await storedFile(db, draft);
      // A rows-to-fix file uploaded again has the column already: its reasons are replaced.
      const fixColumn = draft.headers.findIndex(isFixColumn);
      const headers = fixColumn >= 0 ? draft.headers : [...draft.headers, fixColumnHeader];
      const records = errors.map((row) => {
        // Positions count the file's rows from 1, in order (the missing people come after).
        const cells = [...(rawRows[row.position - 1] ?? [])];
        cells[fixColumn >= 0 ? fixColumn : draft.headers.length] = Object.values(row.errors).join(
          ' ',
        );
        return cells;
      });
      return rowsToFixFile([headers, ...records], draft);
    },

    /**
     * Applies exactly the previewed rows in one transaction; nothing is written if any fails.
     * While one request saves a draft, another for it answers at once "being saved"; once
     * saved, asking again answers with that import (`replayed`), not "not found".
     */
    async commit(
      viewer: Viewer,
      clientId: string,
      draftId: string,
      request: CommitImportRequest,
    ): Promise<{ summary: ImportSummary; replayed: boolean }> {
      await assertClientAccess(db, viewer, clientId);
      const input = commitImportRequestSchema.parse(request);
      const outcome = await db.transaction().execute(async (trx) => {
        if (!(await repo.tryClaimDraftCommit(trx, draftId))) {
          throw new AppError(
            'import_being_saved',
            409,
            'This import is being saved. Its result appears here when it is done.',
          );
        }
        const [saved] = await listImports(trx, clientId, { draftId });
        if (saved) return { id: saved.id, replayed: true };
        await repo.lockClient(trx, clientId);
        const draft = await repo.findDraft(trx, clientId, draftId, { forUpdate: true });
        if (!draft) throw draftGone();
        if (mappingProblems(draft.mapping).length > 0) {
          throw new AppError('mapping_incomplete', 409, 'Finish the column mapping first.');
        }
        if ((await repo.rosterVersion(trx, clientId)) !== draft.rosterVersion) {
          throw new AppError(
            'roster_changed',
            409,
            'The roster changed since this preview. Check the rows again, then confirm.',
          );
        }
        const result = await applyImport(trx, clientId, draft, input);
        await repo.saveMapping(trx, clientId, mappingToRemember(draft.headers, draft.mapping));
        const id = await insertImport(trx, {
          clientId,
          importedBy: viewer.kind === 'staff' ? viewer.id : null,
          fileName: draft.fileName,
          draftId,
          ...result,
        });
        await repo.deleteDraft(trx, draftId);
        await recordAudit(trx, {
          actorUserId: viewer.id,
          action: 'roster.imported',
          subjectType: 'client',
          subjectId: clientId,
          details: { importId: id, ...result },
        });
        return { id, replayed: false };
      });
      const [entry] = await listImports(db, clientId, { draftId });
      if (!entry || entry.id !== outcome.id) throw notFound('That import');
      return { summary: entry, replayed: outcome.replayed };
    },

    async history(viewer: Viewer, clientId: string) {
      await assertClientAccess(db, viewer, clientId);
      return listImports(db, clientId);
    },
  };
}
