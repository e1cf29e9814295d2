// What other features read of plans: the functions the face (index.ts) offers. The queries stay in
// the repository, which is private to this feature (server/features/README.md).

import type { DayMarkRow, Db, RunPlanLinkRow, SessionPlanRow } from '../../lib/db.ts';
import * as plans from './plans.repository.ts';
import type { NamedPlanRow } from './plans.repository.ts';
import * as prescribe from './prescribe.repository.ts';

export function findPlanById(id: string, trx?: Db): Promise<NamedPlanRow | undefined> {
  return plans.findPlanById(id, trx);
}

/** The runner's first plan of a day (the one a run of that day is checked against when not linked). */
export function findFirstPlanOnDate(runnerId: string, date: string, trx?: Db): Promise<SessionPlanRow | undefined> {
  return plans.findFirstPlanOnDate(runnerId, date, trx);
}

/** The plan a run was linked to, or undefined when the run was never linked. */
export function findRunPlanLink(runId: string, trx?: Db): Promise<RunPlanLinkRow | undefined> {
  return plans.findRunPlanLink(runId, trx);
}

/** The runners' plans from `from` to `to` (calendar days, inclusive); a replica may serve it. */
export function listPlansOf(runnerIds: readonly string[], from: string, to: string, trx?: Db): Promise<NamedPlanRow[]> {
  return plans.listPlansOf(runnerIds, from, to, trx);
}

/** The runners' marked days (rest, ill, injured, cross-training) from `from` to `to`; a replica may serve it. */
export function listDayMarksOf(runnerIds: readonly string[], from: string, to: string, trx?: Db): Promise<DayMarkRow[]> {
  return prescribe.listDayMarksOf(runnerIds, from, to, trx);
}
