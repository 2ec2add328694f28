import type { KnownFramesRequest } from '../../../../server/schemas/frames';
import { api } from '../../../lib/api-client';

/** Which of these files (by path on the card and content) the day already holds. */
export const findKnownFrames = (dayId: string, request: KnownFramesRequest) =>
  api<{ known: Array<{ cardPath: string; sha256: string }> }>(`/days/${dayId}/frames/known`, {
    method: 'POST',
    body: request,
  });
