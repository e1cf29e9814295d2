// The public face of the runs feature: the only file other features (and db/) import.
// Everything else in this folder is private to it (server/features/README.md).

export { toRunListItem } from './run-list.ts';
export { lastUploadsOf, listRunItemsOf, listRunLoadsOf, listRunNotesOf } from './run-reads.service.ts';
export { getReadableRun, importFiles, loadRunLaps, toSplit, type UploadedFile } from './runs.service.ts';
export { uploadGuards } from './upload-guards.ts';
