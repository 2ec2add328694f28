import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { SetupCard } from '../../../../server/schemas/setup-card';
import { api } from '../../../lib/api-client';
import { daySetupCardsQueryOptions } from './get-day-setup-cards';
import { cardSourcesQueryOptions } from './list-card-sources';

export const saveSetupCard = ({ stationId, card }: { stationId: string; card: SetupCard }) =>
  api<void>(`/stations/${stationId}/setup-card`, { method: 'PUT', body: { card } });

export function useSaveSetupCard(dayId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: saveSetupCard,
    onSuccess: async () => {
      await queryClient.invalidateQueries({ queryKey: daySetupCardsQueryOptions(dayId).queryKey });
      await queryClient.invalidateQueries({ queryKey: cardSourcesQueryOptions().queryKey });
    },
  });
}
