import { useMutation } from '@tanstack/react-query';
import type { AcceptedResponse, SignInLinkRequest } from '../../../../server/schemas/auth';
import { api } from '../../../lib/api-client';

export const requestSignInLink = (input: SignInLinkRequest) =>
  api<AcceptedResponse>('/sign-in-links', { method: 'POST', body: input });

export const useRequestSignInLink = () => useMutation({ mutationFn: requestSignInLink });
