import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { RegisterInput } from '../../../../shared/auth/schemas.ts';
import type { User } from '../../../../shared/users/schemas.ts';
import { api } from '../../../lib/api-client.ts';
import { authKeys } from './auth-keys.ts';

export function signUp(input: RegisterInput): Promise<{ user: User }> {
  return api.post('/auth/register', input);
}

export function useSignUp() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: signUp,
    onSuccess: ({ user }) => {
      queryClient.clear();
      queryClient.setQueryData(authKeys.me(), user);
    },
  });
}
