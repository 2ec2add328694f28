import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import { daySetupCardsQueryOptions } from './get-day-setup-cards';
import { cardSourcesQueryOptions } from './list-card-sources';

export const copySetupCard = ({
  stationId,
  fromStationId,
}: {
  stationId: string;
  fromStationId: string;
}) =>
  api<void>(`/stations/${stationId}/setup-card/copy`, { method: 'POST', body: { fromStationId } });

export function useCopySetupCard(dayId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: copySetupCard,
    onSuccess: async () => {
      await queryClient.invalidateQueries({ queryKey: daySetupCardsQueryOptions(dayId).queryKey });
      await queryClient.invalidateQueries({ queryKey: cardSourcesQueryOptions().queryKey });
    },
  });
}
