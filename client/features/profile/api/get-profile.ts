import { queryOptions, useSuspenseQuery } from '@tanstack/react-query';
import type { Profile, ProfileAnswer } from '../../../../shared/users/schemas.ts';
import { api } from '../../../lib/api-client.ts';
import { profileKeys } from './profile-keys.ts';

export async function getProfile(): Promise<Profile> {
  const { profile } = await api.get<ProfileAnswer>('/me');
  return profile;
}

export const profileQueryOptions = () => queryOptions({ queryKey: profileKeys.mine(), queryFn: getProfile });

export function useProfile(): Profile {
  return useSuspenseQuery(profileQueryOptions()).data;
}
