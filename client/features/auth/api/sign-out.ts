import { useMutation } from '@tanstack/react-query';
import { paths } from '../../../config/paths.ts';
import { api } from '../../../lib/api-client.ts';

export function signOut(): Promise<void> {
  return api.post('/auth/logout');
}

export function useSignOut() {
  return useMutation({
    mutationFn: signOut,
    // A full page load drops every cached answer of this account and any in-flight request with it.
    onSuccess: () => window.location.assign(paths.signIn.getHref()),
  });
}
