import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { AdminUser, ChangeRoleInput, User } from '../../../../shared/users/schemas.ts';
import { api } from '../../../lib/api-client.ts';
import { adminKeys } from './admin-keys.ts';
import type { UserResponse } from '../../../../shared/auth/schemas.ts';

type ChangeUserRole = ChangeRoleInput & { id: string };

export async function changeUserRole({ id, role }: ChangeUserRole): Promise<User> {
  const { user } = await api.patch<UserResponse>(`/admin/users/${encodeURIComponent(id)}`, { role });
  return user;
}

export function useChangeUserRole() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: changeUserRole,
    onSuccess: (user) =>
      queryClient.setQueryData<AdminUser[]>(adminKeys.users(), (users) =>
        users?.map((row) => (row.id === user.id ? { ...row, ...user } : row)),
      ),
  });
}
