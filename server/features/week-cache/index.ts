/**
 * Assembled weeks cached per runner and invalidated exactly (README.md here). Other features call only this
 * file: every write that feeds a runner's week calls one of the bumps in its own transaction.
 */
export {
  bumpWeekInputs,
  bumpWeekInputsOfCoachedRunners,
  bumpWeekInputsOfRuns,
  forgetKeptWeeks,
  forgetWeeksNaming,
  keepWeek,
  keptWeek,
  readWeekCache,
  storeWeeks,
  weekCacheKeyText,
  type WeekCacheEntry,
  type WeekCacheKey,
} from './week-cache.service.ts';
export { forgetReadyAnswers, keepAnswer, keptAnswer, readyAnswer, readyJson, type ReadyAnswer } from './ready-answers.ts';
