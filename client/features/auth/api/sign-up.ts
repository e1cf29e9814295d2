import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { RegisterInput, SignUpAnswer, SignUpConfirmed } from '../../../../shared/auth/schemas.ts';
import { api } from '../../../lib/api-client.ts';
import { authKeys } from './auth-keys.ts';

/**
 * 201 either way. `confirmation: 'sent'`: nobody is signed in yet, the account is made from the
 * e-mailed link (confirmSignUp). `'not-needed'` (an invitation to this very address): signed in.
 */
export function signUp(input: RegisterInput): Promise<SignUpAnswer> {
  return api.post('/auth/register', input);
}

export function useSignUp() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: signUp,
    onSuccess: ({ user, confirmation }) => {
      if (confirmation !== 'not-needed') return;
      queryClient.clear();
      queryClient.setQueryData(authKeys.me(), user);
    },
  });
}

export function confirmSignUp(token: string): Promise<SignUpConfirmed> {
  return api.post(`/auth/register/${encodeURIComponent(token)}`);
}

export function useConfirmSignUp() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: confirmSignUp,
    onSuccess: ({ user }) => {
      queryClient.clear();
      queryClient.setQueryData(authKeys.me(), user);
    },
  });
}
