import { useMutation } from '@tanstack/react-query';
import type { DeleteAccountInput } from '../../../../shared/history/schemas.ts';
import { paths } from '../../../config/paths.ts';
import { api } from '../../../lib/api-client.ts';

/** DELETE /api/me: 204 and the session cookie cleared, or 400/401 with a sentence (wrong password). */
export function deleteAccount(input: DeleteAccountInput): Promise<void> {
  return api.delete('/me', input);
}

export function useDeleteAccount() {
  return useMutation({
    mutationFn: deleteAccount,
    // A full page load drops every cached answer of the deleted account; the sign-in page says what happened.
    onSuccess: () => window.location.assign(`${paths.signIn.getHref()}?deleted=1`),
  });
}

/** The whole export: a plain link, so the browser streams the .zip to disk with the session cookie. */
export const EXPORT_HREF = '/api/me/export';
