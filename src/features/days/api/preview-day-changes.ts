import { useMutation } from '@tanstack/react-query';
import type { DayChangePreview, DayChangesRequest } from '../../../../server/schemas/day-changes';
import { api } from '../../../lib/api-client';

/** What an edit would do to the bookings; the server writes nothing. */
export const previewDayChanges = (input: { dayId: string; changes: DayChangesRequest }) =>
  api<DayChangePreview>(`/days/${input.dayId}/changes/preview`, {
    method: 'POST',
    body: input.changes,
  });

export const usePreviewDayChanges = () => useMutation({ mutationFn: previewDayChanges });
