// The public face of the plans feature: the only file other features (and db/) import.
// Everything else in this folder is private to it (server/features/README.md).

export { findFirstPlanOnDate, findPlanById, findRunPlanLink, listDayMarksOf, listPlansOf } from './plan-reads.service.ts';
export { toPlan } from './plan-view.ts';
export { PLAN_CHECK_CODE_VERSION } from './plan-check-version.ts';
export { type RunnerCheckInputs, checkRuns, runnerCheckInputs } from './plans.service.ts';
