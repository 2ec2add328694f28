import { useState } from 'react';
import { Link } from 'react-router-dom';
import type { ImportSummary, RosterDraft } from '../../../../server/schemas/roster';
import { Card } from '../../../components/ui/card';
import { Notice } from '../../../components/ui/notice';
import { MappingStep } from './mapping-step';
import { PreviewStep } from './preview-step';
import { UploadStep } from './upload-step';

type Step =
  | { name: 'upload' }
  | { name: 'map'; draft: RosterDraft }
  | { name: 'preview'; draft: RosterDraft }
  | { name: 'done'; summary: ImportSummary };

const stepTitles = ['Upload the file', 'Match the columns', 'Check and confirm'];

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
          <UploadStep
            clientId={clientId}
            onUploaded={(draft) =>
              // Same columns as last time: straight to the preview ("Back to the columns" stays).
              setStep(
                draft.mappingRemembered && draft.mappingProblems.length === 0
                  ? { name: 'preview', draft }
                  : { name: 'map', draft },
              )
            }
          />
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
            clientId={clientId}
            draft={step.draft}
            onBack={() => setStep({ name: 'map', draft: step.draft })}
            onCommitted={(summary) => setStep({ name: 'done', summary })}
          />
        </Card>
      ) : null}
      {step.name === 'done' ? (
        <Notice tone="success">
          <p className="font-semibold">The roster is up to date.</p>
          <p>
            {step.summary.added} added, {step.summary.updated} updated, {step.summary.deactivated}{' '}
            marked inactive, {step.summary.skipped} rows left out
            {step.summary.officesCreated > 0
              ? `, ${step.summary.officesCreated} offices created`
              : ''}
            .{' '}
            <Link className="font-medium underline" to={`/clients/${clientId}/people`}>
              See the people
            </Link>
          </p>
        </Notice>
      ) : null}
    </div>
  );
}
