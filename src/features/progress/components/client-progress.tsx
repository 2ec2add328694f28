import { Card } from '../../../components/ui/card';
import { Notice } from '../../../components/ui/notice';
import { useClientProgress } from '../api/get-client-progress';
import { ProgressChart } from './progress-chart';

/** One client's days side by side: how far booking has got at each office. */
export function ClientProgressCard({
  clientId,
  clientName,
}: {
  clientId: string;
  clientName: string;
}) {
  const progress = useClientProgress(clientId);
  if (progress.isPending) return null;
  if (progress.isError) return <Notice tone="danger">{progress.error.message}</Notice>;
  if (progress.data.days.length === 0) return null;
  return (
    <Card title={`${clientName}: booking progress`}>
      <p className="mb-3">
        {progress.data.booked} of {progress.data.invited} invited people have a slot across{' '}
        {progress.data.days.length} day{progress.data.days.length === 1 ? '' : 's'};{' '}
        {progress.data.photographed} photographed, {progress.data.noShow} no-show
        {progress.data.noShow === 1 ? '' : 's'}.
      </p>
      <ProgressChart
        title="By day"
        groups={progress.data.days.map(({ dayId: _dayId, status, label, ...counts }) => ({
          label: status === 'confirmed' ? label : `${label} (${status})`,
          ...counts,
        }))}
      />
      <div className="mt-4 flex flex-col gap-4">
        <ProgressChart title="By office" groups={progress.data.byOffice} />
        <ProgressChart title="By department" groups={progress.data.byDepartment} />
      </div>
    </Card>
  );
}
