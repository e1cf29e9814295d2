import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { z } from 'zod';
import type { NewRunNoteInputSchema, RunNote, RunNoteAnswer } from '../../../../shared/runs/schemas.ts';
import { api } from '../../../lib/api-client.ts';
import { runNoteKeys } from './run-note-keys.ts';

export async function addRunNote(runId: string, input: z.output<typeof NewRunNoteInputSchema>): Promise<RunNote> {
  const { note } = await api.post<RunNoteAnswer>(`/runs/${encodeURIComponent(runId)}/notes`, input);
  return note;
}

export function useAddRunNote(runId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: z.output<typeof NewRunNoteInputSchema>) => addRunNote(runId, input),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: runNoteKeys.list(runId) }),
  });
}
