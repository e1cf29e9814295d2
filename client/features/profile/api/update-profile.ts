import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { Profile, ProfileAnswer, UpdateProfileInput } from '../../../../shared/users/schemas.ts';
import { api } from '../../../lib/api-client.ts';
import { profileKeys } from './profile-keys.ts';

export async function updateProfile(input: UpdateProfileInput): Promise<Profile> {
  const { profile } = await api.patch<ProfileAnswer>('/me', input);
  return profile;
}

export function useUpdateProfile() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: updateProfile,
    onSuccess: (profile) => queryClient.setQueryData(profileKeys.mine(), profile),
  });
}
