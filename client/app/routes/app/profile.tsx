import type { QueryClient } from '@tanstack/react-query';
import { useQueryClient } from '@tanstack/react-query';
import { Card } from '../../../components/ui/card.tsx';
import { PageHeader } from '../../../components/ui/page-header.tsx';
import { tokensQueryOptions } from '../../../features/api-tokens/api/get-tokens.ts';
import { ApiTokensCard } from '../../../features/api-tokens/components/api-tokens-card.tsx';
import { authKeys } from '../../../features/auth/api/auth-keys.ts';
import { useProfile } from '../../../features/profile/api/get-profile.ts';
import { ProfileForm } from '../../../features/profile/components/profile-form.tsx';
import { formatDate } from '../../../lib/format.ts';

export const createLoader = (queryClient: QueryClient) => async () => {
  // prefetch, not ensure: a failing token list shows its error in its card, not instead of the page.
  await queryClient.prefetchQuery(tokensQueryOptions());
  return null;
};

export default function ProfileRoute() {
  const profile = useProfile();
  const queryClient = useQueryClient();

  return (
    <>
      <PageHeader title="Profile">
        Your account, the numbers your splits and zones are based on, and access for scripts.
      </PageHeader>
      <div className="grid max-w-3xl gap-4">
        <Card title="Account">
          <dl className="grid grid-cols-[auto_1fr] gap-x-6 gap-y-1">
            <dt className="text-ink-muted">E-mail</dt>
            <dd className="break-all">{profile.email}</dd>
            <dt className="text-ink-muted">Role</dt>
            <dd className="capitalize">{profile.role}</dd>
            <dt className="text-ink-muted">Member since</dt>
            <dd>{formatDate(profile.created_at)}</dd>
          </dl>
          <p className="mt-3 text-sm text-ink-muted">Distances show in the unit picked with the mi | km switch at the top.</p>
        </Card>
        <Card title="About you">
          {/* The name also shows in the profile menu, which reads the session user. */}
          <ProfileForm onSaved={() => queryClient.invalidateQueries({ queryKey: authKeys.me() })} />
        </Card>
        <ApiTokensCard />
      </div>
    </>
  );
}
