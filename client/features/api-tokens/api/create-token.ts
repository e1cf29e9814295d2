import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { z } from 'zod';
import type { NamedTokenInputSchema, TokenResponseSchema } from '../../../../shared/auth/schemas.ts';
import { api } from '../../../lib/api-client.ts';
import { tokenKeys } from './token-keys.ts';

export function createToken(input: z.output<typeof NamedTokenInputSchema>): Promise<z.output<typeof TokenResponseSchema>> {
  return api.post('/auth/tokens', input);
}

export function useCreateToken() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: createToken,
    onSuccess: () => queryClient.invalidateQueries({ queryKey: tokenKeys.lists() }),
  });
}
