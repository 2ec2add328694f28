import { countLabels, type DayCounts } from '../../../../server/schemas/invoices';

const shown: Array<keyof DayCounts> = [
  'invited',
  'booked',
  'checkedIn',
  'walkIns',
  'photographed',
  'noShows',
  'missed',
  'picks',
  'extraPicks',
  'retouchesDone',
  'renditionsDelivered',
];

/** The day's figures, each from the day's own records. */
export function SummaryFigures({ counts }: { counts: DayCounts }) {
  return (
    <dl aria-label="Figures" className="grid grid-cols-2 gap-3 sm:grid-cols-4">
      {shown.map((key) => (
        <div key={key} className="rounded-control bg-paper-sunk p-3">
          <dt className="text-sm text-ink-muted">{countLabels[key]}</dt>
          <dd className="text-2xl font-semibold tabular-nums">{counts[key]}</dd>
        </div>
      ))}
    </dl>
  );
}
