// The worker face of the runs feature: what the compute threads (server/features/compute) load.
// Only pure computation and file reads: no database pool, no network (server/features/README.md).

export { type ImportComputeInput, type ImportComputeOutput, computeImport, NOT_READ_WHILE_ARRIVING } from './import-compute.ts';
export { decodeColumns, type TrackLayout } from './track-blob.ts';
