// What other features read of squads: the functions the face (index.ts) offers. The queries stay in
// the repository, which is private to this feature (server/features/README.md).

import type { Db, SquadRow } from '../../lib/db.ts';
import * as squads from './squads.repository.ts';

/** Ids of the coaches of every squad the runner belongs to now; a replica may serve it. */
export function findCoachIdsOfRunner(runnerId: string, trx?: Db): Promise<string[]> {
  return squads.findCoachIdsOfRunner(runnerId, trx);
}

export function findSquadById(id: string, trx?: Db): Promise<SquadRow | undefined> {
  return squads.findSquadById(id, trx);
}

/** The squad's runners by name, with when they joined. */
export function listMembers(
  squadId: string,
  trx?: Db,
): Promise<Array<{ id: string; name: string; email: string; joined_at: Date }>> {
  return squads.listMembers(squadId, trx);
}

/** Every squad with its coach (role, time zone, whether they take the weekly digest), oldest squad first. */
export function listSquadsWithCoach(trx?: Db) {
  return squads.listSquadsWithCoach(trx);
}
