import { useMutation } from '@tanstack/react-query';
import type { AcceptedResponse } from '../../../../server/schemas/auth';
import { api } from '../../../lib/api-client';

export const resendInvitation = (id: string) =>
  api<AcceptedResponse>(`/users/${id}/invitation`, { method: 'POST' });

export const useResendInvitation = () => useMutation({ mutationFn: resendInvitation });
