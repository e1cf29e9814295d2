import { useMutation } from '@tanstack/react-query';
import type { ChangePasswordInput } from '../../../../shared/auth/schemas.ts';
import { api } from '../../../lib/api-client.ts';

export function changePassword(input: ChangePasswordInput): Promise<void> {
  return api.post('/me/password', input);
}

export function useChangePassword() {
  return useMutation({ mutationFn: changePassword });
}
