// The public face of the runs feature: the only file other features (and db/) import.
// Everything else in this folder is private to it (server/features/README.md).

export { listRunNotesOf } from './run-notes.repository.ts';
export { RUN_LIST_COLUMNS, type RunListRow, toRunListItem } from './runs.repository.ts';
export { getReadableRun, importFiles, loadRunLaps, toSplit, type UploadedFile } from './runs.service.ts';
export { uploadGuards } from './upload-guards.ts';
