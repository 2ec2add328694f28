import type { QueryClient } from '@tanstack/react-query';
import type { LoaderFunctionArgs } from 'react-router-dom';
import { daySetupCardsQueryOptions } from '../../../features/setup-card/api/get-day-setup-cards';
import { requireRole } from '../../guards';

/** Both setup-card pages need the studio roles and the day's cards before they render. */
export const makeLoader =
  (queryClient: QueryClient) =>
  async ({ request, params }: LoaderFunctionArgs) => {
    await requireRole(queryClient, request, ['studio_admin', 'photographer']);
    await queryClient.ensureQueryData(daySetupCardsQueryOptions(params.dayId ?? ''));
    return null;
  };
