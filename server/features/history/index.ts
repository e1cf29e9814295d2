// The public face of the history feature: the only file other features (and db/) import.
// Everything else in this folder is private to it (server/features/README.md).

export { findImportStatuses } from './imports.repository.ts';
export { importsDir } from './imports.service.ts';
