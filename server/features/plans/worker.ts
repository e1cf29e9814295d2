// The worker face of the plans feature: what the compute threads (server/features/compute) load.
// Only pure computation and file reads: no database pool, no network (server/features/README.md).

export { type PlanCheckComputeInput, type PlanCheckComputeOutput, computePlanCheck } from './plan-check-compute.ts';
