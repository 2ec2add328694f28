import type { QueryClient } from '@tanstack/react-query';
import { useParams, type LoaderFunctionArgs } from 'react-router-dom';
import { Button } from '../../../components/ui/button';
import { scheduleQueryOptions } from '../../../features/progress/api/get-schedule';
import { DaySheet } from '../../../features/progress/components/day-sheet';
import { requireRole } from '../../guards';

export const makeLoader =
  (queryClient: QueryClient) =>
  async ({ request, params }: LoaderFunctionArgs) => {
    await requireRole(queryClient, request, ['studio_admin', 'coordinator', 'photographer']);
    await queryClient.ensureQueryData(scheduleQueryOptions(params.dayId ?? ''));
    return null;
  };

export function DaySheetPage() {
  const dayId = useParams().dayId ?? '';
  return (
    <>
      <div className="mb-4 flex items-center justify-between print:hidden">
        <h1 className="text-2xl font-semibold">Day sheet</h1>
        <Button onClick={() => window.print()}>Print</Button>
      </div>
      <DaySheet dayId={dayId} />
    </>
  );
}
