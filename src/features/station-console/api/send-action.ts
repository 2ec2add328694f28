import type { ConsoleAction, ConsoleActionResult } from '../../../../server/schemas/console';
import { api } from '../../../lib/api-client';

/** Sends one recorded change; the idempotency key makes sending it again harmless. */
export const sendConsoleAction = (dayId: string, action: ConsoleAction) =>
  api<ConsoleActionResult>(`/days/${dayId}/console/actions`, { method: 'POST', body: action });
