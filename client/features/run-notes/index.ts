// The public face of the run-notes feature: the only file other client features import.

export { addRunNote } from './api/add-run-note.ts';
export { runNoteKeys } from './api/run-note-keys.ts';
