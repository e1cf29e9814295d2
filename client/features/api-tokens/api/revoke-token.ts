import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '../../../lib/api-client.ts';
import { tokenKeys } from './token-keys.ts';

export function revokeToken(id: string): Promise<void> {
  return api.delete(`/auth/tokens/${encodeURIComponent(id)}`);
}

export function useRevokeToken() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: revokeToken,
    onSuccess: () => queryClient.invalidateQueries({ queryKey: tokenKeys.lists() }),
  });
}
