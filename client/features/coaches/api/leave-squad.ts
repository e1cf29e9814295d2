import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '../../../lib/api-client.ts';
import { coachKeys } from './coach-keys.ts';

/** A runner leaves a squad: the same route a coach uses to remove a runner, with the runner's own id. */
export function leaveSquad({ squadId, runnerId }: { squadId: string; runnerId: string }): Promise<void> {
  return api.delete(`/squads/${encodeURIComponent(squadId)}/members/${encodeURIComponent(runnerId)}`);
}

export function useLeaveSquad() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: leaveSquad,
    onSuccess: () => queryClient.invalidateQueries({ queryKey: coachKeys.lists() }),
  });
}
