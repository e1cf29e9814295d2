import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { LoginInput } from '../../../../shared/auth/schemas.ts';
import type { User } from '../../../../shared/users/schemas.ts';
import { api } from '../../../lib/api-client.ts';
import { authKeys } from './auth-keys.ts';

export function signIn(input: LoginInput): Promise<{ user: User }> {
  return api.post('/auth/login', input);
}

export function useSignIn() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: signIn,
    onSuccess: ({ user }) => {
      queryClient.clear();
      queryClient.setQueryData(authKeys.me(), user);
    },
  });
}
