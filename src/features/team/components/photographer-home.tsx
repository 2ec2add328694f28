import { Card } from '../../../components/ui/card';
import { EmptyState } from '../../../components/ui/empty-state';
import { PageHeading } from '../../../components/ui/page-heading';
import { SafetyCautions } from '../../../components/ui/safety-cautions';

export function PhotographerHome({ name }: { name: string }) {
  return (
    <>
      <PageHeading title={`Hello, ${name.split(' ')[0]}`}>
        Your shoot days and stations.
      </PageHeading>
      <div className="grid gap-5 md:grid-cols-2">
        <Card title="Assigned days">
          <EmptyState title="No shoot days assigned to you yet">
            When the studio admin puts you on a station, the day appears here.
          </EmptyState>
        </Card>
        <Card title="On the set">
          <SafetyCautions />
        </Card>
      </div>
    </>
  );
}
