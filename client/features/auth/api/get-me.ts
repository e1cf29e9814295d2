import { queryOptions, useSuspenseQuery } from '@tanstack/react-query';
import type { User } from '../../../../shared/users/schemas.ts';
import { api, isApiError } from '../../../lib/api-client.ts';
import { authKeys } from './auth-keys.ts';
import type { UserResponse } from '../../../../shared/auth/schemas.ts';

/** The signed-in user, or null when nobody is signed in (a 401 is an answer here, not a failure). */
export async function getMe(): Promise<User | null> {
  try {
    const { user } = await api.get<UserResponse>('/auth/me');
    return user;
  } catch (error) {
    if (isApiError(error, 401)) return null;
    throw error;
  }
}

export const meQueryOptions = () => queryOptions({ queryKey: authKeys.me(), queryFn: getMe });

export function useMe(): User | null {
  return useSuspenseQuery(meQueryOptions()).data;
}
