import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { Booking, CreateBookingRequest } from '../../../../server/schemas/booking';
import { api } from '../../../lib/api-client';

export const createBooking = (input: CreateBookingRequest) =>
  api<Booking>('/bookings', { method: 'POST', body: input });

/** Any booking change refreshes the sitter's days and every slot list and day summary. */
export function useBookingInvalidation() {
  const queryClient = useQueryClient();
  return () =>
    queryClient
      .invalidateQueries({ queryKey: ['sitters', 'me', 'days'] })
      .then(() => queryClient.invalidateQueries({ queryKey: ['days'] }));
}

export function useCreateBooking() {
  const invalidate = useBookingInvalidation();
  return useMutation({ mutationFn: createBooking, onSettled: invalidate });
}
