import { useMutation } from '@tanstack/react-query';
import type { Booking } from '../../../../server/schemas/booking';
import { api } from '../../../lib/api-client';
import { useBookingInvalidation } from './create-booking';

export const cancelBooking = (bookingId: string) =>
  api<Booking>(`/bookings/${bookingId}`, { method: 'DELETE' });

export function useCancelBooking() {
  const invalidate = useBookingInvalidation();
  return useMutation({ mutationFn: cancelBooking, onSettled: invalidate });
}
