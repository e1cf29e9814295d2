// The public face of the plans feature: the only file other features (and db/) import.
// Everything else in this folder is private to it (server/features/README.md).

export { findFirstPlanOnDate, findPlanById, findRunPlanLink, listPlansOf, toPlan } from './plans.repository.ts';
export { type RunnerCheckInputs, checkRuns, runnerCheckInputs } from './plans.service.ts';
export { listDayMarksOf } from './prescribe.repository.ts';
