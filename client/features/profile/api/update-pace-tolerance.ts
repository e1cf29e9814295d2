import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { PaceToleranceAnswer } from '../../../../shared/plans/prescribe-schemas.ts';
import type { Profile } from '../../../../shared/users/schemas.ts';
import { api } from '../../../lib/api-client.ts';
import { profileKeys } from './profile-keys.ts';

export async function updatePaceTolerance({ runnerId, paceTolerance }: { runnerId: string; paceTolerance: number }) {
  const { pace_tolerance } = await api.put<PaceToleranceAnswer>(`/runners/${encodeURIComponent(runnerId)}/pace-tolerance`, {
    pace_tolerance: paceTolerance,
  });
  return pace_tolerance;
}

/** Sets the signed-in runner's own tolerance (a coach may set a squad runner's through the same route). */
export function useUpdatePaceTolerance(runnerId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: ({ pace_tolerance }: { pace_tolerance: number }) =>
      updatePaceTolerance({ runnerId, paceTolerance: pace_tolerance }),
    onSuccess: (paceTolerance) =>
      queryClient.setQueryData<Profile>(profileKeys.mine(), (profile) =>
        profile ? { ...profile, pace_tolerance: paceTolerance } : profile,
      ),
  });
}
