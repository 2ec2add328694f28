import { useState } from 'react';
import { Link } from 'react-router-dom';
import type { ImportSummary, RosterDraft } from '../../../../server/schemas/roster';
import { Card } from '../../../components/ui/card';
import { Button } from '../../../components/ui/button';
import { Notice } from '../../../components/ui/notice';
import { formatDateTime, plural } from '../../../lib/format';
import { useOpenImport } from '../api/get-open-import';
import { MappingStep } from './mapping-step';
import { PreviewStep } from './preview-step';
import { UploadStep } from './upload-step';

type Step =
  | { name: 'upload' }
  | { name: 'map'; draft: RosterDraft }
  // round: a preview checked again starts afresh (its choices and the refused save's message).
  | { name: 'preview'; draft: RosterDraft; round?: number }
  | { name: 'done'; summary: ImportSummary };

const stepTitles = ['Upload the file', 'Match the columns', 'Check and confirm'];

/** "1,200 added, 3 updated, …": what the commit wrote, in the preview's number format. */
function summaryLine(summary: ImportSummary): string {
  const parts = [
    `${summary.added.toLocaleString()} added`,
    `${summary.updated.toLocaleString()} updated`,
    `${summary.deactivated.toLocaleString()} marked inactive`,
    `${plural(summary.skipped, 'row')} left out`,
  ];
  if (summary.officesCreated > 0) parts.push(`${plural(summary.officesCreated, 'office')} created`);
  return `${parts.join(', ')}.`;
}

/** A file uploaded earlier and not saved: straight back to its columns or its preview. */
function OpenImport({
  clientId,
  onResume,
}: {
  clientId: string;
  onResume: (draft: RosterDraft) => void;
}) {
  const open = useOpenImport(clientId);
  const draft = open.data?.draft;
  if (!draft) return null;
  return (
    <Notice tone="info">
      <p>
        Your import of {draft.fileName} ({plural(draft.rowCount, 'row')}) is not saved yet; it is
        kept until {formatDateTime(draft.expiresAt)}. Uploading another file replaces it.
      </p>
      <div className="mt-2">
        <Button variant="secondary" onClick={() => onResume(draft)}>
          Continue with {draft.fileName}
        </Button>
      </div>
    </Notice>
  );
}

/** Same columns as last time: straight to the preview ("Back to the columns" stays). */
const firstStepOf = (draft: RosterDraft): Step =>
  draft.mappingRemembered && draft.mappingProblems.length === 0
    ? { name: 'preview', draft }
    : { name: 'map', draft };

/** Upload, map, preview, commit: nothing reaches the roster before the last step. */
export function RosterImportWizard({ clientId }: { clientId: string }) {
  const [step, setStep] = useState<Step>({ name: 'upload' });
  const index = { upload: 0, map: 1, preview: 2, done: 3 }[step.name];

  return (
    <div className="flex flex-col gap-5">
      <ol className="flex flex-wrap gap-4 text-sm" aria-label="Import steps">
        {stepTitles.map((title, at) => (
          <li
            key={title}
            aria-current={at === index ? 'step' : undefined}
            className={at === index ? 'font-semibold text-spruce-700' : 'text-ink-muted'}
          >
            {at + 1}. {title}
          </li>
        ))}
      </ol>
      {step.name === 'upload' ? (
        <Card title={stepTitles[0]}>
          <div className="flex flex-col gap-4">
            <OpenImport clientId={clientId} onResume={(draft) => setStep(firstStepOf(draft))} />
            <UploadStep clientId={clientId} onUploaded={(draft) => setStep(firstStepOf(draft))} />
          </div>
        </Card>
      ) : null}
      {step.name === 'map' ? (
        <Card title={stepTitles[1]}>
          <MappingStep
            clientId={clientId}
            draft={step.draft}
            onMapped={(draft) => setStep({ name: 'preview', draft })}
            onRestart={() => setStep({ name: 'upload' })}
          />
        </Card>
      ) : null}
      {step.name === 'preview' ? (
        <Card title={stepTitles[2]}>
          <PreviewStep
            key={step.round ?? 0}
            clientId={clientId}
            draft={step.draft}
            onBack={() => setStep({ name: 'map', draft: step.draft })}
            onCommitted={(summary) => setStep({ name: 'done', summary })}
            onRechecked={(draft) =>
              setStep({ name: 'preview', draft, round: (step.round ?? 0) + 1 })
            }
          />
        </Card>
      ) : null}
      {step.name === 'done' ? (
        <Notice tone="success">
          <p className="font-semibold">The roster is up to date.</p>
          <p>
            {summaryLine(step.summary)}{' '}
            <Link className="font-medium underline" to={`/clients/${clientId}/people`}>
              See the people
            </Link>
          </p>
        </Notice>
      ) : null}
    </div>
  );
}
