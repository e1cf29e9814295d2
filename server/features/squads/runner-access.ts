import { canReadRunnerData, type Actor } from '../../../shared/auth/permissions.ts';
import { ForbiddenError, NotFoundError } from '../../lib/errors.ts';
import { findCoachIdsOfRunner } from './squads.repository.ts';

/**
 * Throws 404 unless `actor` may read the data of runner `ownerId` (the rule lives in
 * shared/auth/permissions.ts). 404, not 403: other people's ids must not reveal that they exist.
 * `notFoundMessage` names what was asked for ("There is no run with this id."). Database errors
 * pass through untouched, so an outage answers 503 rather than a misleading 404.
 */
export async function assertCanReadRunner(actor: Actor, ownerId: string, notFoundMessage?: string): Promise<void> {
  if (actor.id === ownerId || actor.role === 'admin') return;
  const coachIds = actor.role === 'coach' ? await findCoachIdsOfRunner(ownerId) : [];
  if (!canReadRunnerData(actor, ownerId, coachIds)) throw new NotFoundError(notFoundMessage);
}

/**
 * Throws unless `actor` may write plans for runner `runnerId`: the runner, or a coach of one of their
 * squads. Someone who may read but not write (an admin) gets 403; anyone else 404.
 */
export async function assertCanPlanFor(actor: Actor, runnerId: string): Promise<void> {
  if (actor.id === runnerId) return;
  const coachIds = actor.role === 'coach' ? await findCoachIdsOfRunner(runnerId) : [];
  if (actor.role === 'coach' && coachIds.includes(actor.id)) return;
  if (canReadRunnerData(actor, runnerId, coachIds))
    throw new ForbiddenError('Only the runner and their coaches write their plans.');
  throw new NotFoundError();
}
