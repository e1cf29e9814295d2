// What other features read of fuel: the functions the face (index.ts) offers. The queries stay in
// the repository, which is private to this feature (server/features/README.md).

import type { Db, FuelTakenRow, RunCheckinRow } from '../../lib/db.ts';
import * as fuel from './fuel.repository.ts';

/** The fuel taken recorded on these runs (none for a run without a record); a replica may serve it. */
export function findFuelTakenOf(runIds: readonly string[], trx?: Db): Promise<FuelTakenRow[]> {
  return fuel.findFuelTakenOf(runIds, trx);
}

/** The check-ins recorded on these runs; a replica may serve it. */
export function findRunCheckinsOf(runIds: readonly string[], trx?: Db): Promise<RunCheckinRow[]> {
  return fuel.findRunCheckinsOf(runIds, trx);
}
