import { queryOptions, useQuery } from '@tanstack/react-query';
import type { RunNote, RunNoteListAnswer } from '../../../../shared/runs/schemas.ts';
import { api } from '../../../lib/api-client.ts';
import { runNoteKeys } from './run-note-keys.ts';

/** Notes on a run, oldest first: the runner's and their coaches'. */
export async function getRunNotes(runId: string): Promise<RunNote[]> {
  const { notes } = await api.get<RunNoteListAnswer>(`/runs/${encodeURIComponent(runId)}/notes`);
  return notes;
}

export const runNotesQueryOptions = (runId: string) =>
  queryOptions({ queryKey: runNoteKeys.list(runId), queryFn: () => getRunNotes(runId) });

export function useRunNotes(runId: string) {
  return useQuery(runNotesQueryOptions(runId));
}
