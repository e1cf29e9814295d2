// What other features call of the week cache: the functions the face (index.ts) offers. The queries stay in
// the repository, which is private to this feature (server/features/README.md).

import type { Db } from '../../lib/db.ts';
import * as cache from './week-cache.repository.ts';
import { forgetReadyAnswers } from './ready-answers.ts';
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
  keptAt?: ReadonlyMap<string, string>,
  trx?: Db,
): Promise<Map<string, WeekCacheEntry>> {
  return cache.readWeekCache(keys, codeVersion, keptAt, trx);
}

/** Assembled weeks this process keeps (beside the stored ones), so a week still valid is not read again. */
export const KEPT_WEEKS_MAX = 4_000;

interface KeptWeek {
  counter: string;
  codeVersion: string;
  today: string;
  body: unknown;
}

const keptWeeks = new Map<string, KeptWeek>();

/** The week this process keeps for `key`, whatever its counter (the caller compares), or undefined. */
export function keptWeek(key: WeekCacheKey): KeptWeek | undefined {
  const text = cache.weekCacheKeyText(key);
  const kept = keptWeeks.get(text);
  if (kept) {
    // Most recently used last: the map's order is the eviction order.
    keptWeeks.delete(text);
    keptWeeks.set(text, kept);
  }
  return kept;
}

/** Keeps a week built or read at `counter` (never replacing one kept at a newer counter). */
export function keepWeek(key: WeekCacheKey, week: KeptWeek): void {
  const text = cache.weekCacheKeyText(key);
  const kept = keptWeeks.get(text);
  if (kept && BigInt(kept.counter) > BigInt(week.counter)) return;
  keptWeeks.delete(text);
  keptWeeks.set(text, week);
  for (const oldest of keptWeeks.keys()) {
    if (keptWeeks.size <= KEPT_WEEKS_MAX) break;
    keptWeeks.delete(oldest);
  }
}

/** Forgets every kept week and ready answer (account deletion: a kept week may name the deleted user). */
export function forgetKeptWeeks(): void {
  keptWeeks.clear();
  forgetReadyAnswers();
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
  forgetKeptWeeks();
  return cache.forgetWeeksNaming(userId, trx);
}
