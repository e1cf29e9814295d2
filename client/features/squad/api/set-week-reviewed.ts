import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '../../../lib/api-client.ts';
import { squadKeys } from './squad-keys.ts';
import { weekKeys } from './week-keys.ts';

type ReviewInput = { runnerId: string; start: string; reviewed: boolean };

export async function setWeekReviewed({ runnerId, start, reviewed }: ReviewInput): Promise<void> {
  await api.put(`/runners/${encodeURIComponent(runnerId)}/weeks/${encodeURIComponent(start)}/review`, { reviewed });
}

export function useSetWeekReviewed() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: setWeekReviewed,
    onSuccess: (_data, { runnerId }) =>
      Promise.all([
        queryClient.invalidateQueries({ queryKey: weekKeys.runner(runnerId) }),
        queryClient.invalidateQueries({ queryKey: squadKeys.overviews() }),
      ]),
  });
}
