import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { ActivityKind } from '../../../../shared/runs/activity-kind.ts';
import type { RunListItem, RunListItemAnswer } from '../../../../shared/runs/schemas.ts';
import type { RunDetail } from '../../../../shared/runs/types.ts';
import { api } from '../../../lib/api-client.ts';
import { runKeys } from './run-keys.ts';

/** Renames a run or changes its kind (run, ride, hike). */
export async function renameRun({ id, ...changes }: { id: string; name?: string; kind?: ActivityKind }): Promise<RunListItem> {
  const { run } = await api.patch<RunListItemAnswer>(`/runs/${encodeURIComponent(id)}`, changes);
  return run;
}

export function useRenameRun() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: renameRun,
    onSuccess: (run) => {
      queryClient.setQueryData<RunDetail>(runKeys.detail(run.id), (detail) =>
        detail
          ? { ...detail, name: run.name, kind: run.kind, summary: { ...detail.summary, name: run.name, kind: run.kind } }
          : detail,
      );
      return queryClient.invalidateQueries({ queryKey: runKeys.lists() });
    },
  });
}
