import { useState, type FormEvent } from 'react';
import {
  rosterFieldLabels,
  rosterFields,
  statusTargetLabel,
  type ColumnMapping,
  type ColumnTarget,
  type RosterDraft,
} from '../../../../server/schemas/roster';
import { Button } from '../../../components/ui/button';
import { SelectField } from '../../../components/ui/field';
import { Notice } from '../../../components/ui/notice';
import { useRemapImport } from '../api/remap-import';
import { fileReadAs } from './file-read-as';

const targetOptions: Array<{ value: ColumnTarget; label: string }> = [
  ...rosterFields.map((field) => ({ value: field, label: rosterFieldLabels[field] })),
  { value: 'status', label: statusTargetLabel },
  { value: 'extra', label: 'Keep as an extra column' },
  { value: 'ignore', label: 'Leave out' },
];

/** Step 2: one choice per column of the file, pre-filled with the suggestion. */
export function MappingStep({
  clientId,
  draft,
  onMapped,
  onRestart,
}: {
  clientId: string;
  draft: RosterDraft;
  onMapped: (draft: RosterDraft) => void;
  onRestart: () => void;
}) {
  const [mapping, setMapping] = useState<ColumnMapping>(draft.mapping);
  const remap = useRemapImport();
  // The draft as the server holds it now: after a check of another mapping, that one, so
  // choosing the first mapping again is a change to send, not "nothing changed".
  const latest = remap.data ?? draft;
  const problems = latest.mappingProblems;
  const changed = mapping.some((target, index) => target !== latest.mapping[index]);

  const submit = (event: FormEvent) => {
    event.preventDefault();
    if (!changed && latest.mappingProblems.length === 0) return onMapped(latest);
    remap.mutate(
      { clientId, draftId: draft.id, mapping },
      { onSuccess: (next) => (next.mappingProblems.length === 0 ? onMapped(next) : undefined) },
    );
  };

  return (
    <form
      onSubmit={submit}
      noValidate
      aria-label="Match the columns"
      className="flex flex-col gap-4"
    >
      <p className="text-ink-muted">
        {fileReadAs(draft)} Say which of our fields each column holds; the choice is remembered for
        the next import.
      </p>
      {problems.length > 0 ? (
        <Notice tone="caution">
          <ul className="list-disc pl-5">
            {problems.map((problem) => (
              <li key={problem}>{problem}</li>
            ))}
          </ul>
        </Notice>
      ) : null}
      {remap.isError ? <Notice tone="danger">{remap.error.message}</Notice> : null}
      <div className="grid gap-4 sm:grid-cols-2 lg:grid-cols-3">
        {draft.headers.map((header, index) => (
          <SelectField
            key={`${header}-${index}`}
            label={header || `Column ${index + 1} (no name)`}
            value={mapping[index] ?? 'ignore'}
            onChange={(value) =>
              setMapping((current) =>
                current.map((target, at) => (at === index ? (value as ColumnTarget) : target)),
              )
            }
            options={targetOptions}
            hint={`e.g. ${
              draft.sampleRows
                .map((row) => row[index] ?? '')
                .filter(Boolean)
                // A long note would fill the page: the start says what the column holds.
                .map((value) => (value.length > 60 ? `${value.slice(0, 57)}…` : value))
                .slice(0, 2)
                .join(' · ') || '(empty)'
            }${
              draft.guessedColumns.includes(index) && mapping[index] === draft.mapping[index]
                ? ' — chosen from the values, as the header names no field: check it'
                : ''
            }`}
          />
        ))}
      </div>
      <div className="flex flex-wrap gap-3">
        <Button type="submit" busy={remap.isPending}>
          Check the rows
        </Button>
        <Button variant="secondary" onClick={onRestart} disabled={remap.isPending}>
          Choose another file
        </Button>
      </div>
    </form>
  );
}
