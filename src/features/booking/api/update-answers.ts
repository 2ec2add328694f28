import { useMutation } from '@tanstack/react-query';
import type { Booking, SittingNeedsRequest } from '../../../../server/schemas/booking';
import { api } from '../../../lib/api-client';
import { useBookingInvalidation } from './create-booking';

export const updateAnswers = (input: { bookingId: string; answers: SittingNeedsRequest }) =>
  api<Booking>(`/bookings/${input.bookingId}/answers`, { method: 'PUT', body: input.answers });

export function useUpdateAnswers() {
  const invalidate = useBookingInvalidation();
  return useMutation({ mutationFn: updateAnswers, onSettled: invalidate });
}

/** Where the sitter's calendar file downloads from; the sequence makes a moved one fresh. */
export const calendarFileUrl = (booking: Pick<Booking, 'id' | 'sequence'>) =>
  `/api/bookings/${booking.id}/calendar.ics?v=${booking.sequence}`;
