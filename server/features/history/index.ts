// The public face of the history feature: the only file other features (and db/) import.
// Everything else in this folder is private to it (server/features/README.md).

export { sweepLeftoverArchives } from './archive-sweep.ts';
