import type { QueryClient } from '@tanstack/react-query';
import { redirect } from 'react-router-dom';
import type { Role } from '../../server/schemas/common';
import type { SessionResponse } from '../../server/schemas/auth';
import { sessionQueryOptions } from '../features/auth/api/get-session';

/** Loader helper: the session, or a redirect to sign-in that comes back here afterwards. */
export async function requireSession(
  queryClient: QueryClient,
  request: Request,
): Promise<SessionResponse> {
  const session = await queryClient.ensureQueryData(sessionQueryOptions());
  if (!session) {
    const url = new URL(request.url);
    const next = url.pathname + url.search;
    throw redirect(next === '/' ? '/sign-in' : `/sign-in?next=${encodeURIComponent(next)}`);
  }
  return session;
}

export async function requireRole(
  queryClient: QueryClient,
  request: Request,
  roles: readonly Role[],
) {
  const session = await requireSession(queryClient, request);
  if (!roles.includes(session.user.role)) {
    throw new Response('Your role does not give access to this page.', { status: 403 });
  }
  return session;
}
