import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { MessageResponse, RegisterInput, SignUpConfirmed } from '../../../../shared/auth/schemas.ts';
import { api } from '../../../lib/api-client.ts';
import { authKeys } from './auth-keys.ts';

/** Always 202 with the same sentence: the account is made from the e-mailed link (confirmSignUp). */
export function signUp(input: RegisterInput): Promise<MessageResponse> {
  return api.post('/auth/register', input);
}

export function useSignUp() {
  return useMutation({ mutationFn: signUp });
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
