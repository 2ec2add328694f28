import { Card } from '../../../components/ui/card';
import { PageHeading } from '../../../components/ui/page-heading';
import { SafetyCautions } from '../../../components/ui/safety-cautions';
import { useDays } from '../../days/api/list-days';
import { DaysList } from '../../days/components/days-list';

export function PhotographerHome({ name }: { name: string }) {
  const days = useDays();
  return (
    <>
      <PageHeading title={`Hello, ${name.split(' ')[0]}`}>
        Your shoot days and stations.
      </PageHeading>
      <div className="grid gap-5 md:grid-cols-2">
        <Card title="Assigned days">
          {days.isPending ? (
            <p role="status">Loading your days…</p>
          ) : (
            <DaysList
              days={days.data?.days ?? []}
              emptyHint="When the studio admin puts you on a station, the day appears here."
            />
          )}
        </Card>
        <Card title="On the set">
          <SafetyCautions />
        </Card>
      </div>
    </>
  );
}
