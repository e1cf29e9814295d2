import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { z } from 'zod';
import type { NewRunNoteInputSchema } from '../../../../shared/runs/schemas.ts';
import type { AddedWeekNote, AddedWeekNoteAnswer } from '../../../../shared/weeks/week-answer.ts';
import { api } from '../../../lib/api-client.ts';
import { weekKeys } from './week-keys.ts';

type NoteInput = z.output<typeof NewRunNoteInputSchema>;

export async function addWeekNote(runnerId: string, start: string, input: NoteInput): Promise<AddedWeekNote> {
  const { note } = await api.post<AddedWeekNoteAnswer>(
    `/runners/${encodeURIComponent(runnerId)}/weeks/${encodeURIComponent(start)}/notes`,
    input,
  );
  return note;
}

export function useAddWeekNote(runnerId: string, start: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: NoteInput) => addWeekNote(runnerId, start, input),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: weekKeys.runner(runnerId) }),
  });
}
