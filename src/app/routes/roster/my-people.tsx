import type { QueryClient } from '@tanstack/react-query';
import { redirect, type LoaderFunctionArgs } from 'react-router-dom';
import { requireRole } from '../../guards';

/** "People" in a coordinator's menu: their own client's directory. */
export const makeLoader =
  (queryClient: QueryClient) =>
  async ({ request }: LoaderFunctionArgs) => {
    const session = await requireRole(queryClient, request, ['studio_admin', 'coordinator']);
    const clientId = session.user.clientId;
    return redirect(clientId ? `/clients/${clientId}/people` : '/studio/clients');
  };
