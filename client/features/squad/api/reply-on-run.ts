import { useMutation, useQueryClient } from '@tanstack/react-query';
import { addRunNote } from '../../run-notes/index.ts';
import { runNoteKeys } from '../../run-notes/index.ts';
import { weekKeys } from './week-keys.ts';

/** A note on a run written from the week review; the week and the run's own notes are read again. */
export function useReplyOnRun(runId: string, runnerId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (text: string) => addRunNote(runId, { text }),
    onSuccess: async () => {
      await Promise.all([
        queryClient.invalidateQueries({ queryKey: weekKeys.runner(runnerId) }),
        queryClient.invalidateQueries({ queryKey: runNoteKeys.list(runId) }),
      ]);
    },
  });
}
