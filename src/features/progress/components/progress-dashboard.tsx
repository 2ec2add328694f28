import { EmptyState } from '../../../components/ui/empty-state';
import { Notice } from '../../../components/ui/notice';
import { useProgress } from '../api/get-progress';
import { ProgressChart } from './progress-chart';

export function ProgressDashboard({ dayId }: { dayId: string }) {
  const progress = useProgress(dayId);
  if (progress.isPending) return <p role="status">Loading progress…</p>;
  if (progress.isError) return <Notice tone="danger">{progress.error.message}</Notice>;
  const data = progress.data;
  if (data.listed === 0) {
    return (
      <EmptyState title="Nobody is invited yet">
        Import the roster for this office (or pick departments), then send the invitations.
      </EmptyState>
    );
  }
  return (
    <div className="flex flex-col gap-5">
      <dl className="grid grid-cols-2 gap-3 text-center sm:grid-cols-4 lg:grid-cols-7">
        {[
          ['On the list', data.listed],
          // Only people whose invitation was actually sent count as invited.
          ['Invited (mailed)', data.invited],
          ['Booked', data.booked],
          ['Not yet booked', data.unbooked],
          ['Checked in', data.checkedIn],
          ['Photographed', data.photographed],
          ['No-show', data.noShow],
        ].map(([label, value]) => (
          <div key={label} className="rounded-control bg-paper-sunk p-3">
            <dt className="text-sm text-ink-muted">{label}</dt>
            <dd className="text-2xl font-semibold tabular-nums">{value}</dd>
          </div>
        ))}
      </dl>
      <ProgressChart title="By office" groups={data.byOffice} />
      <ProgressChart title="By department" groups={data.byDepartment} />
      <div>
        <h3 className="mb-2 font-medium">Not yet booked</h3>
        {data.unbookedPeople.length === 0 ? (
          <p>Everyone invited has a slot.</p>
        ) : (
          <ul className="max-h-64 overflow-auto text-sm">
            {data.unbookedPeople.map((person) => (
              <li key={person.id} className="border-b border-line py-1.5">
                {person.name}{' '}
                <span className="text-ink-muted">
                  · {person.department ?? 'No department'} · {person.email}
                </span>
              </li>
            ))}
          </ul>
        )}
      </div>
    </div>
  );
}
