// What other features call of the week cache: the functions the face (index.ts) offers. The queries stay in
// the repository, which is private to this feature (server/features/README.md).

import type { Db } from '../../lib/db.ts';
import * as cache from './week-cache.repository.ts';
import type { WeekCacheEntry, WeekCacheKey } from './week-cache.repository.ts';

export type { WeekCacheEntry, WeekCacheKey } from './week-cache.repository.ts';
export { weekCacheKeyText } from './week-cache.repository.ts';

/** Adds one to these runners' counters: call after a write that feeds their weeks, in its transaction. */
export function bumpWeekInputs(runnerIds: readonly string[], trx?: Db): Promise<void> {
  return cache.bumpWeekInputs(runnerIds, trx);
}

/** Adds one to the counters of the runners who own these runs. */
export function bumpWeekInputsOfRuns(runIds: readonly string[], trx?: Db): Promise<void> {
  return cache.bumpWeekInputsOfRuns(runIds, trx);
}

/** Adds one to the counters of every runner in the coach's squads (the coach's name is in their weeks). */
export function bumpWeekInputsOfCoachedRunners(coachId: string, trx?: Db): Promise<void> {
  return cache.bumpWeekInputsOfCoachedRunners(coachId, trx);
}

/** The runners' counters and their stored weeks still valid for them, in one query; a replica may serve it. */
export function readWeekCache(
  keys: readonly WeekCacheKey[],
  codeVersion: string,
  trx?: Db,
): Promise<Map<string, WeekCacheEntry>> {
  return cache.readWeekCache(keys, codeVersion, trx);
}

/** Stores built weeks; a week built at an older counter never replaces one built at a newer. */
export function storeWeeks(
  rows: ReadonlyArray<WeekCacheKey & { counter: string; code_version: string; today: string; body: unknown }>,
  trx?: Db,
): Promise<void> {
  return cache.storeWeeks(rows, trx);
}

/** Drops every stored week that names the user: account deletion. */
export function forgetWeeksNaming(userId: string, trx?: Db): Promise<void> {
  return cache.forgetWeeksNaming(userId, trx);
}
