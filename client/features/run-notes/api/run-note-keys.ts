export const runNoteKeys = {
  all: ['run-notes'] as const,
  lists: () => [...runNoteKeys.all, 'list'] as const,
  list: (runId: string) => [...runNoteKeys.lists(), runId] as const,
};
