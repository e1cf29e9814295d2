// What other features read of runs: the functions the face (index.ts) offers. The queries stay in
// the repositories, which are private to this feature (server/features/README.md).

import type { RunNote } from '../../../shared/runs/schemas.ts';
import type { Db } from '../../lib/db.ts';
import * as runNotes from './run-notes.repository.ts';

/** The notes on these runs, oldest first, with their authors; a replica may serve it. */
export function listRunNotesOf(runIds: readonly string[], trx?: Db): Promise<RunNote[]> {
  return runNotes.listRunNotesOf(runIds, trx);
}
