import { canReadRunnerData, type Actor } from '../../../shared/auth/permissions.ts';
import { NotFoundError } from '../../lib/errors.ts';
import { findCoachIdsOfRunner } from './squads.repository.ts';

/**
 * Throws 404 unless `actor` may read the data of runner `ownerId` (the rule lives in
 * shared/auth/permissions.ts). 404, not 403: other people's ids must not reveal that they exist.
 */
export async function assertCanReadRunner(actor: Actor, ownerId: string): Promise<void> {
  if (actor.id === ownerId || actor.role === 'admin') return;
  const coachIds = actor.role === 'coach' ? await findCoachIdsOfRunner(ownerId) : [];
  if (!canReadRunnerData(actor, ownerId, coachIds)) throw new NotFoundError();
}
