import type { QueryClient } from '@tanstack/react-query';
import { Navigate, Outlet, useLocation, type LoaderFunctionArgs } from 'react-router-dom';
import { AppShell } from '../../../components/layout/app-shell.tsx';
import { paths } from '../../../config/paths.ts';
import { useMe } from '../../../features/auth/api/get-me.ts';
import { ProfileMenu } from '../../../features/auth/components/profile-menu.tsx';
import { profileQueryOptions } from '../../../features/profile/api/get-profile.ts';
import { UnitSwitch } from '../../../features/profile/components/unit-switch.tsx';
import type { UnreadAnswer } from '../../../../shared/notes/schemas.ts';
import { useUnread } from '../../../features/notes/api/unread.ts';
import { requireUser } from '../../guards.ts';

export const createLoader =
  (queryClient: QueryClient) =>
  async ({ request }: LoaderFunctionArgs) => {
    // Start the profile read alongside the session check; ensureQueryData below joins it.
    void queryClient.prefetchQuery(profileQueryOptions());
    await requireUser(queryClient, request);
    await queryClient.ensureQueryData(profileQueryOptions());
    return null;
  };

/**
 * Notes about the user's own runs and weeks count beside Log; a coach's notes about squad runners beside Squad
 * (the answer lists the newest 100; for a coach, any beyond those are counted beside Squad).
 */
function unreadBySection(unread: UnreadAnswer | undefined, meId: string, role: string) {
  if (!unread) return {};
  if (role !== 'coach') return { log: unread.count };
  const own = unread.items.filter((i) => i.runner_id === meId).length;
  return { log: own, squad: unread.count - own };
}

export default function AppLayout() {
  const user = useMe();
  const unread = useUnread(Boolean(user));
  const location = useLocation();
  // The session can end while a page is open (signed out in another tab, expired).
  if (!user) return <Navigate to={paths.signIn.getHref(location.pathname + location.search)} replace />;

  return (
    <AppShell
      role={user.role}
      unread={unreadBySection(unread, user.id, user.role)}
      actions={
        <>
          <UnitSwitch />
          <ProfileMenu user={user} />
        </>
      }
    >
      <Outlet />
    </AppShell>
  );
}
