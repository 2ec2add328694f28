import { Link } from 'react-router-dom';

export interface NextStep {
  label: string;
  detail: string;
  to?: string;
  done?: boolean;
}

/** A short numbered list of what to do next; finished steps are ticked. */
export function NextSteps({ steps }: { steps: NextStep[] }) {
  return (
    <ol className="flex flex-col gap-3">
      {steps.map((step, index) => (
        <li key={step.label} className="flex gap-3">
          <span
            aria-hidden
            className={`flex size-7 shrink-0 items-center justify-center rounded-full text-sm font-semibold ${
              step.done ? 'bg-success-600 text-paper-raised' : 'bg-spruce-100 text-spruce-700'
            }`}
          >
            {step.done ? '✓' : index + 1}
          </span>
          <div>
            <p className="font-medium">
              {step.to && !step.done ? (
                <Link to={step.to} className="text-spruce-700 underline">
                  {step.label}
                </Link>
              ) : (
                step.label
              )}
              {step.done ? <span className="sr-only"> (done)</span> : null}
            </p>
            <p className="text-sm text-ink-muted">{step.detail}</p>
          </div>
        </li>
      ))}
    </ol>
  );
}
