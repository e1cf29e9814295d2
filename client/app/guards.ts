import type { QueryClient } from '@tanstack/react-query';
import { redirect } from 'react-router-dom';
import { hasPermission, type Permission } from '../../shared/auth/permissions.ts';
import type { User } from '../../shared/users/schemas.ts';
import { paths } from '../config/paths.ts';
import { meQueryOptions } from '../features/auth/api/get-me.ts';

/** The signed-in user, or a redirect to sign-in that comes back to the requested page. */
export async function requireUser(queryClient: QueryClient, request: Request): Promise<User> {
  const user = await queryClient.ensureQueryData(meQueryOptions());
  if (user) return user;
  const url = new URL(request.url);
  throw redirect(paths.signIn.getHref(url.pathname + url.search));
}

/** Role-gated pages send everyone else to their log; the server refuses their data regardless. */
export async function requireAccess(queryClient: QueryClient, request: Request, permission: Permission): Promise<User> {
  const user = await requireUser(queryClient, request);
  if (!hasPermission(user.role, permission)) throw redirect(paths.log.getHref());
  return user;
}
