import type { QueryClient } from '@tanstack/react-query';
import { Link, useNavigate, type LoaderFunctionArgs } from 'react-router-dom';
import { Button } from '../../../components/ui/button';
import { Logo } from '../../../components/ui/logo';
import { Notice } from '../../../components/ui/notice';
import { useSession } from '../../../features/auth/api/get-session';
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
    await queryClient.prefetchQuery(consoleDaysQueryOptions());
    return null;
  };

/**
 * The console's landing: the station this tablet ran last is one tap away ("Continue"), but
 * the page never jumps there by itself, so the photographer can always get back to their days.
 */
export function ConsolePickerPage() {
  const days = useConsoleDays();
  const session = useSession();
  const navigate = useNavigate();
  const open = (dayId: string, stationId: string) => {
    saveStationChoice({ dayId, stationId });
    void navigate(`/console/${dayId}/${stationId}`);
  };
  const choice = loadStationChoice();
  const lastDay = choice ? days.data?.days.find((day) => day.id === choice.dayId) : undefined;
  const lastStation = lastDay?.stations.find((station) => station.id === choice?.stationId);
  const homeLabel = session.data?.user.role === 'photographer' ? 'My days' : 'Home';

  return (
    <main className="mx-auto flex max-w-4xl flex-col gap-6 p-6">
      <div className="flex flex-wrap items-center gap-4">
        <Logo size={36} />
        <h1 className="flex-1 text-3xl font-bold">Station console</h1>
        <Link
          to="/"
          className="inline-flex min-h-touch items-center rounded-control px-3 text-lg font-medium text-spruce-700 underline"
        >
          ← {homeLabel}
        </Link>
      </div>
      {days.isError ? <Notice tone="danger">{days.error.message}</Notice> : null}
      {lastDay && lastStation ? (
        <section
          aria-label="Last used on this tablet"
          className="flex flex-wrap items-center gap-4 rounded-card border border-spruce-500 bg-spruce-50 p-4"
        >
          <p className="flex-1 text-lg">
            This tablet last ran <strong>{lastStation.name}</strong> · {lastDay.date} ·{' '}
            {lastDay.clientName} · {lastDay.officeName}
          </p>
          <Button className="min-h-16 text-lg" onClick={() => open(lastDay.id, lastStation.id)}>
            Continue at {lastStation.name}
          </Button>
        </section>
      ) : null}
      {choice && days.isError ? (
        // Offline: the station's console still opens from what this tablet stored.
        <Button className="min-h-16 text-lg" onClick={() => open(choice.dayId, choice.stationId)}>
          Continue at the station this tablet ran last
        </Button>
      ) : null}
      <p className="text-lg text-ink-muted">Which station does this tablet run?</p>
      {days.data ? <StationPicker days={days.data.days} onPick={open} /> : null}
    </main>
  );
}
