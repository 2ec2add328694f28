import { useMutation } from '@tanstack/react-query';
import type { AcceptedResponse, PasswordResetRequest } from '../../../../server/schemas/auth';
import { api } from '../../../lib/api-client';

export const requestPasswordReset = (input: PasswordResetRequest) =>
  api<AcceptedResponse>('/password-resets', { method: 'POST', body: input });

export const useRequestPasswordReset = () => useMutation({ mutationFn: requestPasswordReset });
