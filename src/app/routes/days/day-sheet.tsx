import type { QueryClient } from '@tanstack/react-query';
import { useParams, useSearchParams, type LoaderFunctionArgs } from 'react-router-dom';
import { Button } from '../../../components/ui/button';
import { scheduleQueryOptions } from '../../../features/progress/api/get-schedule';
import { DaySheet } from '../../../features/progress/components/day-sheet';
import { RecordedSheet } from '../../../features/progress/components/recorded-sheet';
import { requireRole } from '../../guards';

export const makeLoader =
  (queryClient: QueryClient) =>
  async ({ request, params }: LoaderFunctionArgs) => {
    await requireRole(queryClient, request, ['studio_admin', 'coordinator', 'photographer']);
    await queryClient.ensureQueryData(scheduleQueryOptions(params.dayId ?? ''));
    return null;
  };

/** Before the day: the bookings with room to write; after it: what the console recorded. */
export function DaySheetPage() {
  const dayId = useParams().dayId ?? '';
  const [searchParams, setSearchParams] = useSearchParams();
  const after = searchParams.get('version') === 'recorded';
  const versions = [
    { recorded: false, label: 'Before the day' },
    { recorded: true, label: 'After the day (as recorded)' },
  ];
  return (
    <>
      <div className="mb-4 flex flex-wrap items-center justify-between gap-3 print:hidden">
        <h1 className="text-2xl font-semibold">Day sheet</h1>
        <div role="group" aria-label="Version" className="flex gap-2">
          {versions.map((version) => (
            <button
              key={version.label}
              type="button"
              aria-pressed={after === version.recorded}
              onClick={() => setSearchParams(version.recorded ? { version: 'recorded' } : {})}
              className={`min-h-touch rounded-control border px-3 ${
                after === version.recorded
                  ? 'border-spruce-500 bg-spruce-50'
                  : 'border-line bg-paper-raised'
              }`}
            >
              {version.label}
            </button>
          ))}
        </div>
        <Button onClick={() => window.print()}>Print</Button>
      </div>
      {after ? <RecordedSheet dayId={dayId} /> : <DaySheet dayId={dayId} />}
    </>
  );
}
