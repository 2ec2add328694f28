import type { QueryClient } from '@tanstack/react-query';
import { ApiError } from '../../../lib/api-client';
import { requireRole } from '../../guards';

/**
 * The console's pages need a staff session; without network the tablet keeps working from
 * what it stored, and the server checks the session again when the changes are sent.
 */
export async function requireConsoleAccess(queryClient: QueryClient, request: Request) {
  try {
    await requireRole(queryClient, request, ['studio_admin', 'photographer', 'coordinator']);
  } catch (error) {
    if (error instanceof ApiError && error.status === 0) return;
    throw error;
  }
}
