import type { QueryClient } from '@tanstack/react-query';
import { useEffect } from 'react';
import { useNavigate, useParams, type LoaderFunctionArgs } from 'react-router-dom';
import { useSignOut } from '../../../features/auth/api/sign-out';
import { StationConsoleScreen } from '../../../features/station-console/components/station-console-screen';
import { saveStationChoice } from '../../../features/station-console/model/station-choice';
import { registerConsoleServiceWorker } from '../../../features/station-console/offline/register-service-worker';
import { requireConsoleAccess } from './console-guard';

export const makeLoader =
  (queryClient: QueryClient) =>
  async ({ request, params }: LoaderFunctionArgs) => {
    await requireConsoleAccess(queryClient, request);
    // Opening a station's address also makes it this tablet's station.
    if (params.dayId && params.stationId) {
      saveStationChoice({ dayId: params.dayId, stationId: params.stationId });
    }
    return null;
  };

/** Full screen, no site header: the tablet shows only the station. */
export function StationConsolePage() {
  const { dayId = '', stationId = '' } = useParams();
  const signOut = useSignOut();
  const navigate = useNavigate();
  useEffect(() => registerConsoleServiceWorker(), []);
  return (
    <StationConsoleScreen
      key={`${dayId}/${stationId}`}
      dayId={dayId}
      stationId={stationId}
      onSignOut={() =>
        signOut.mutate(undefined, { onSuccess: () => navigate('/sign-in', { replace: true }) })
      }
    />
  );
}
