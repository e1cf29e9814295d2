import { useMutation } from '@tanstack/react-query';
import { api } from '../../../lib/api-client.ts';

/** 204 on success; 400 for a forged link, 410 for a used or expired one, each with a sentence. */
export function resetPassword({ token, password }: { token: string; password: string }): Promise<void> {
  return api.post(`/auth/password-reset/${encodeURIComponent(token)}`, { password });
}

export function useResetPassword(token: string) {
  return useMutation({ mutationFn: ({ password }: { password: string }) => resetPassword({ token, password }) });
}
