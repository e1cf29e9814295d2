import { queryOptions, useSuspenseQuery } from '@tanstack/react-query';
import type { AdminUser, AdminUserListAnswer } from '../../../../shared/users/schemas.ts';
import { api } from '../../../lib/api-client.ts';
import { adminKeys } from './admin-keys.ts';

export async function getUsers(): Promise<AdminUser[]> {
  const { users } = await api.get<AdminUserListAnswer>('/admin/users');
  return users;
}

export const usersQueryOptions = () => queryOptions({ queryKey: adminKeys.users(), queryFn: getUsers });

export function useUsers(): AdminUser[] {
  return useSuspenseQuery(usersQueryOptions()).data;
}
