import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { RunListItem } from '../../../../shared/runs/schemas.ts';
import type { RunDetail } from '../../../../shared/runs/types.ts';
import { api } from '../../../lib/api-client.ts';
import { runKeys } from './run-keys.ts';

export async function renameRun({ id, name }: { id: string; name: string }): Promise<RunListItem> {
  const { run } = await api.patch<{ run: RunListItem }>(`/runs/${encodeURIComponent(id)}`, { name });
  return run;
}

export function useRenameRun() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: renameRun,
    onSuccess: (run) => {
      queryClient.setQueryData<RunDetail>(runKeys.detail(run.id), (detail) =>
        detail ? { ...detail, name: run.name, summary: { ...detail.summary, name: run.name } } : detail,
      );
      return queryClient.invalidateQueries({ queryKey: runKeys.lists() });
    },
  });
}
