// The public face of the compute feature: the only file other features (and db/) import.
// Everything else in this folder is private to it (server/features/README.md).

export {
  ComputeAccountBusyError,
  ComputeBusyError,
  ComputeCrashError,
  ComputeTimeoutError,
  computeArrivingImportJob,
  computeImportJob,
  computeLimits,
  computePlanCheckJob,
} from './compute-pool.ts';
