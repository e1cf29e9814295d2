// What other features read of runs: the functions the face (index.ts) offers. The queries stay in
// the repositories, which are private to this feature (server/features/README.md).

import type { RunNote } from '../../../shared/runs/schemas.ts';
import type { Db } from '../../lib/db.ts';
import type { RunListRow } from './run-list.ts';
import * as runNotes from './run-notes.repository.ts';
import * as runs from './runs.repository.ts';

/** The notes on these runs, oldest first, with their authors; a replica may serve it. */
export function listRunNotesOf(runIds: readonly string[], trx?: Db): Promise<RunNote[]> {
  return runNotes.listRunNotesOf(runIds, trx);
}

/** Several runners' runs (rides and hikes left out) between two local dates, inclusive: what loads, trends and week totals read. */
export function listRunLoadsOf(runnerIds: readonly string[], from: string, to: string, trx?: Db): Promise<runs.RunLoadRow[]> {
  return runs.listRunLoadsOf(runnerIds, from, to, trx);
}

/** Several runners' runs (rides and hikes left out) between two local dates, inclusive, as list items with their TRIMP. */
export function listRunItemsOf(
  runnerIds: readonly string[],
  from: string,
  to: string,
  trx?: Db,
): Promise<Array<RunListRow & { user_id: string; trimp: number | null }>> {
  return runs.listRunItemsOf(runnerIds, from, to, trx);
}

/** Each runner's latest upload time (runners without runs are left out). */
export function lastUploadsOf(runnerIds: readonly string[], trx?: Db): Promise<Map<string, Date>> {
  return runs.lastUploadsOf(runnerIds, trx);
}
