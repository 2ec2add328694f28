import { useState } from 'react';
import {
  previewKinds,
  type ImportSummary,
  type PreviewKind,
  type RosterDraft,
} from '../../../../server/schemas/roster';
import { Button } from '../../../components/ui/button';
import { Notice } from '../../../components/ui/notice';
import { ApiError } from '../../../lib/api-client';
import { plural } from '../../../lib/format';
import { fileReadAs } from './file-read-as';
import { useCommitImport } from '../api/commit-import';
import { useRemapImport } from '../api/remap-import';
import { OfficeTimeZones, guessTimeZone } from './office-time-zones';
import { PreviewTable, kindLabels } from './preview-table';

/** Step 3: counts, the rows of each kind, new offices' time zones, and the one confirm. */
export function PreviewStep({
  clientId,
  draft,
  onBack,
  onCommitted,
  onRechecked,
}: {
  clientId: string;
  draft: RosterDraft;
  onBack: () => void;
  onCommitted: (summary: ImportSummary) => void;
  /** The same file and columns checked again against the roster as it is now. */
  onRechecked: (draft: RosterDraft) => void;
}) {
  // Open on what needs a decision first: rows in error, then conflicts.
  const [kind, setKind] = useState<PreviewKind | 'all' | 'warned'>(
    draft.counts.error > 0 ? 'error' : draft.counts.conflict > 0 ? 'conflict' : 'all',
  );
  const [zones, setZones] = useState<Record<string, string>>(() =>
    Object.fromEntries(
      draft.newOffices.map((office) => [
        office,
        guessTimeZone(
          office,
          draft.knownOffices.map((known) => known.timeZone),
        ),
      ]),
    ),
  );
  const [zoneErrors, setZoneErrors] = useState<Record<string, string | undefined>>({});
  const { counts } = draft;
  // Nobody is deactivated unless the coordinator asks: an export of one office would otherwise
  // mark everyone else inactive.
  const rosterSize = counts.update + counts.conflict + counts.unchanged + counts.missing;
  const mostlyMissing = counts.missing > rosterSize / 2;
  const [deactivateMissing, setDeactivateMissing] = useState(false);
  const [rekeyConflicts, setRekeyConflicts] = useState(false);
  const [waiting, setWaiting] = useState(false);
  const commit = useCommitImport();
  const recheck = useRemapImport();
  // Someone saved the roster after this preview was made: the same file and columns, checked
  // again, give a preview that can be saved.
  const rosterChanged = commit.error instanceof ApiError && commit.error.code === 'roster_changed';
  const changes =
    counts.add +
    counts.update +
    (rekeyConflicts ? counts.conflict : 0) +
    (deactivateMissing ? counts.missing : 0);
  // The "All rows" button counts what its table pages: every row of every kind.
  const allRows = previewKinds.reduce((sum, item) => sum + counts[item], 0);

  const confirm = () => {
    const missing = draft.newOffices.filter((office) => !zones[office]);
    if (missing.length > 0) {
      setZoneErrors(
        Object.fromEntries(
          missing.map((office) => [`office:${office}`, `Choose the time zone of ${office}.`]),
        ),
      );
      return;
    }
    setZoneErrors({});
    setWaiting(false);
    commit.mutate(
      {
        clientId,
        draftId: draft.id,
        officeTimeZones: zones,
        deactivateMissing,
        rekeyConflicts,
        onWaiting: () => setWaiting(true),
      },
      {
        onSuccess: onCommitted,
        onError: (error) => {
          if (error instanceof ApiError) {
            setZoneErrors(
              Object.fromEntries(
                Object.entries(error.fieldErrors).map(([key, list]) => [key, list?.[0]]),
              ),
            );
          }
        },
      },
    );
  };

  return (
    <div className="flex flex-col gap-5">
      {/* Said here too: a remembered mapping skips the step that says it first. */}
      <p className="text-ink-muted">{fileReadAs(draft)}</p>
      <div role="group" aria-label="Show rows" className="flex flex-wrap gap-2">
        {(['all', ...previewKinds] as const).map((item) => {
          const count = item === 'all' ? allRows : counts[item];
          return (
            <Button
              key={item}
              variant={kind === item ? 'primary' : 'secondary'}
              aria-pressed={kind === item}
              onClick={() => setKind(item)}
            >
              {item === 'all' ? 'All rows' : kindLabels[item]}: {count.toLocaleString()}
            </Button>
          );
        })}
      </div>
      {counts.error > 0 ? (
        <Notice tone="caution">
          {plural(counts.error, 'row')} {counts.error === 1 ? 'has' : 'have'} problems and will be
          left out.{' '}
          <a
            className="font-medium underline"
            href={`/api/clients/${clientId}/roster/imports/${draft.id}/errors.csv`}
            download
          >
            Download the rows to fix (CSV)
          </a>
          {counts.conflict > 0
            ? ` (with the ${plural(counts.conflict, 'row')} whose e-mail belongs to someone else)`
            : ''}
          : save the other rows first, then correct these and upload them as a new import; or go on
          without them. (Uploading now replaces this preview.)
        </Notice>
      ) : null}
      {draft.rowsWithWarnings > 0 ? (
        <Notice tone="caution">
          {draft.rowsWithWarnings === 1
            ? '1 row comes with a warning'
            : `${draft.rowsWithWarnings.toLocaleString()} rows come with a warning`}{' '}
          (a stored name kept, characters removed, or values past the last column left out).{' '}
          <button
            type="button"
            className="min-h-touch font-medium underline"
            onClick={() => setKind('warned')}
          >
            Show them
          </button>
        </Notice>
      ) : null}
      {counts.conflict > 0 ? (
        <Notice tone="caution">
          {counts.conflict === 1
            ? '1 row has the e-mail of someone on the roster but a different employee id. It is left out unless you confirm below that they are the same person.'
            : `${counts.conflict.toLocaleString()} rows have the e-mail of someone on the roster but a different employee id. They are left out unless you confirm below that they are the same people.`}
        </Notice>
      ) : null}
      <PreviewTable key={kind} clientId={clientId} draftId={draft.id} kind={kind} />
      <OfficeTimeZones
        offices={draft.newOffices}
        value={zones}
        onChange={setZones}
        errors={zoneErrors}
      />
      {counts.conflict > 0 ? (
        <label className="flex min-h-touch items-center gap-3">
          <input
            type="checkbox"
            className="size-5"
            checked={rekeyConflicts}
            onChange={(event) => setRekeyConflicts(event.target.checked)}
          />
          {counts.conflict === 1
            ? 'The row with the same e-mail and another id is the same person: change their employee id to the file’s'
            : `The ${counts.conflict.toLocaleString()} rows with the same e-mail and another id are the same people: change their employee ids to the file’s`}
        </label>
      ) : null}
      {counts.missing > 0 ? (
        <label className="flex min-h-touch items-center gap-3">
          <input
            type="checkbox"
            className="size-5"
            checked={deactivateMissing}
            onChange={(event) => setDeactivateMissing(event.target.checked)}
          />
          Mark the {counts.missing.toLocaleString()} people who are not in this file as inactive
          (they stay on record with their bookings)
        </label>
      ) : null}
      {deactivateMissing && counts.missing > 0 ? (
        <div className="flex flex-col gap-3">
          {mostlyMissing ? (
            <Notice tone="caution">
              This file leaves out {counts.missing.toLocaleString()} of the{' '}
              {rosterSize.toLocaleString()} people on the roster. If it is only part of the staff
              list, untick the box above.
            </Notice>
          ) : null}
          <PreviewTable
            clientId={clientId}
            draftId={draft.id}
            kind="missing"
            caption="People to mark inactive"
          />
        </div>
      ) : null}
      {commit.isPending && waiting ? (
        <Notice tone="info">
          This import is being saved. Its result appears here when it is done.
        </Notice>
      ) : null}
      {commit.isError ? (
        <Notice tone="danger">
          {commit.error.message}
          {rosterChanged ? (
            <>
              {' '}
              <Button
                variant="secondary"
                busy={recheck.isPending}
                onClick={() =>
                  recheck.mutate(
                    { clientId, draftId: draft.id, mapping: draft.mapping },
                    { onSuccess: onRechecked },
                  )
                }
              >
                Check the rows again
              </Button>
            </>
          ) : null}
        </Notice>
      ) : null}
      {recheck.isError ? <Notice tone="danger">{recheck.error.message}</Notice> : null}
      <div className="flex flex-wrap gap-3">
        <Button
          onClick={confirm}
          busy={commit.isPending}
          disabled={changes === 0 && draft.newOffices.length === 0}
        >
          {changes === 0 ? 'Nothing to change' : `Save ${plural(changes, 'change')} to the roster`}
        </Button>
        <Button variant="secondary" onClick={onBack} disabled={commit.isPending}>
          Back to the columns
        </Button>
      </div>
    </div>
  );
}
