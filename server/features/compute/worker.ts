// The worker face of the compute feature: what the compute threads (server/features/compute) load.
// Only pure computation and file reads: no database pool, no network (server/features/README.md).

export { workerDatabase } from './worker-db.ts';
