import type { QueryClient } from '@tanstack/react-query';
import { redirect, useNavigate, type LoaderFunctionArgs } from 'react-router-dom';
import { Logo } from '../../../components/ui/logo';
import { Notice } from '../../../components/ui/notice';
import {
  consoleDaysQueryOptions,
  useConsoleDays,
} from '../../../features/station-console/api/get-console-days';
import { StationPicker } from '../../../features/station-console/components/station-picker';
import {
  loadStationChoice,
  saveStationChoice,
} from '../../../features/station-console/model/station-choice';
import { requireConsoleAccess } from './console-guard';

export const makeLoader =
  (queryClient: QueryClient) =>
  async ({ request }: LoaderFunctionArgs) => {
    await requireConsoleAccess(queryClient, request);
    // A tablet that already knows its station goes straight there, unless asked to change.
    const choice = loadStationChoice();
    if (choice && !new URL(request.url).searchParams.has('change')) {
      throw redirect(`/console/${choice.dayId}/${choice.stationId}`);
    }
    await queryClient.prefetchQuery(consoleDaysQueryOptions());
    return null;
  };

export function ConsolePickerPage() {
  const days = useConsoleDays();
  const navigate = useNavigate();
  return (
    <main className="mx-auto flex max-w-4xl flex-col gap-6 p-6">
      <div className="flex items-center gap-4">
        <Logo size={36} />
        <h1 className="text-3xl font-bold">Station console</h1>
      </div>
      <p className="text-lg text-ink-muted">Which station does this tablet run?</p>
      {days.isError ? <Notice tone="danger">{days.error.message}</Notice> : null}
      {days.data ? (
        <StationPicker
          days={days.data.days}
          onPick={(dayId, stationId) => {
            saveStationChoice({ dayId, stationId });
            void navigate(`/console/${dayId}/${stationId}`);
          }}
        />
      ) : null}
    </main>
  );
}
