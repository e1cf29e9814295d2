// The public face of the notes feature: the only file other features (and db/) import.
// Everything else in this folder is private to it (server/features/README.md).

export { findReadNoteIds } from './note-reads.service.ts';
