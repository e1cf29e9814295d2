import { useMutation } from '@tanstack/react-query';
import type { z } from 'zod';
import type { MessageResponse, PasswordResetRequestSchema } from '../../../../shared/auth/schemas.ts';
import { api } from '../../../lib/api-client.ts';

/** Always 202 with the same sentence, whether or not the address has an account. */
export function requestPasswordReset(input: z.output<typeof PasswordResetRequestSchema>): Promise<MessageResponse> {
  return api.post('/auth/password-reset', input);
}

export function useRequestPasswordReset() {
  return useMutation({ mutationFn: requestPasswordReset });
}
