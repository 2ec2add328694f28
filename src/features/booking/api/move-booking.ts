import { useMutation } from '@tanstack/react-query';
import type { Booking } from '../../../../server/schemas/booking';
import { api } from '../../../lib/api-client';
import { useBookingInvalidation } from './create-booking';

export const moveBooking = (input: { bookingId: string; startsAt: string }) =>
  api<Booking>(`/bookings/${input.bookingId}`, {
    method: 'PATCH',
    body: { startsAt: input.startsAt },
  });

export function useMoveBooking() {
  const invalidate = useBookingInvalidation();
  return useMutation({ mutationFn: moveBooking, onSettled: invalidate });
}
