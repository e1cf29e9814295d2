import { useMutation } from '@tanstack/react-query';
import { paths } from '../../../config/paths.ts';
import { api } from '../../../lib/api-client.ts';

export function signOutEverywhere(): Promise<void> {
  return api.post('/auth/sign-out-everywhere');
}

export function useSignOutEverywhere() {
  return useMutation({
    mutationFn: signOutEverywhere,
    // This session ended too: a full page load drops every cached answer of this account.
    onSuccess: () => window.location.assign(paths.signIn.getHref()),
  });
}
