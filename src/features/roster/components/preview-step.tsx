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
import { useCommitImport } from '../api/commit-import';
import { OfficeTimeZones, guessTimeZone } from './office-time-zones';
import { PreviewTable, kindLabels } from './preview-table';

/** Step 3: counts, the rows of each kind, new offices' time zones, and the one confirm. */
export function PreviewStep({
  clientId,
  draft,
  onBack,
  onCommitted,
}: {
  clientId: string;
  draft: RosterDraft;
  onBack: () => void;
  onCommitted: (summary: ImportSummary) => void;
}) {
  const [kind, setKind] = useState<PreviewKind | 'all'>(draft.counts.error > 0 ? 'error' : 'all');
  const [zones, setZones] = useState<Record<string, string>>(() =>
    Object.fromEntries(draft.newOffices.map((office) => [office, guessTimeZone(office)])),
  );
  const [zoneErrors, setZoneErrors] = useState<Record<string, string | undefined>>({});
  const { counts } = draft;
  // A file that leaves out most of the roster is more likely a partial export than a list of
  // leavers: then nobody is deactivated unless the coordinator asks for it.
  const rosterSize = counts.update + counts.unchanged + counts.missing;
  const mostlyMissing = counts.missing > rosterSize / 2;
  const [deactivateMissing, setDeactivateMissing] = useState(!mostlyMissing);
  const commit = useCommitImport();
  const changes = counts.add + counts.update + (deactivateMissing ? counts.missing : 0);

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
    commit.mutate(
      { clientId, draftId: draft.id, officeTimeZones: zones, deactivateMissing },
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
      <div role="group" aria-label="Show rows" className="flex flex-wrap gap-2">
        {(['all', ...previewKinds] as const).map((item) => {
          const count = item === 'all' ? draft.rowCount : counts[item];
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
          {counts.error.toLocaleString()} rows have problems and will be left out.{' '}
          <a
            className="font-medium underline"
            href={`/api/clients/${clientId}/roster/imports/${draft.id}/errors.csv`}
            download
          >
            Download the rows to fix (CSV)
          </a>
          , correct them and upload again, or go on without them.
        </Notice>
      ) : null}
      <PreviewTable key={kind} clientId={clientId} draftId={draft.id} kind={kind} />
      <OfficeTimeZones
        offices={draft.newOffices}
        value={zones}
        onChange={setZones}
        errors={zoneErrors}
      />
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
      {mostlyMissing && counts.missing > 0 ? (
        <Notice tone="caution">
          This file leaves out {counts.missing.toLocaleString()} of the{' '}
          {rosterSize.toLocaleString()} people on the roster. If it is only part of the staff list,
          leave the box above unticked.
        </Notice>
      ) : null}
      {commit.isError ? <Notice tone="danger">{commit.error.message}</Notice> : null}
      <div className="flex flex-wrap gap-3">
        <Button
          onClick={confirm}
          busy={commit.isPending}
          disabled={changes === 0 && draft.newOffices.length === 0}
        >
          {changes === 0
            ? 'Nothing to change'
            : `Save ${changes.toLocaleString()} changes to the roster`}
        </Button>
        <Button variant="secondary" onClick={onBack} disabled={commit.isPending}>
          Back to the columns
        </Button>
      </div>
    </div>
  );
}
