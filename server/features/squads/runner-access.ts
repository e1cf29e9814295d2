import { canReadRunnerData, type Actor } from '../../../shared/auth/permissions.ts';
import { ForbiddenError, NotFoundError } from '../../lib/errors.ts';
import type { SquadRow } from '../../lib/db.ts';
import { findCoachIdsOfRunner, findSquadById, isMember } from './squads.repository.ts';

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

/**
 * The squad `squadId` when `actor` is its coach: the one squad-owner check (the squad's settings,
 * invitations, fee, digest and overview all go through it). `adminMayRead` lets an admin through
 * too, for pages that only read. 404 otherwise, the same for someone else's squad and a made-up id.
 */
export async function squadCoachedBy(actor: Actor, squadId: string, { adminMayRead = false } = {}): Promise<SquadRow> {
  const squad = await findSquadById(squadId);
  if (!squad || (squad.coach_id !== actor.id && !(adminMayRead && actor.role === 'admin')))
    throw new NotFoundError('There is no squad of yours with this id.');
  return squad;
}

/** Whether the runner is in the squad now (a coach acting on one runner of their squad checks this). */
export function isSquadMember(squadId: string, runnerId: string): Promise<boolean> {
  return isMember(squadId, runnerId);
}

/**
 * The squad `squadId` when `actor` is one of its runners: the one squad-membership check (a runner's
 * own fee, checkout and receipts). 404 otherwise, the same for someone else's squad and a made-up id.
 */
export async function squadJoinedBy(actor: Actor, squadId: string): Promise<SquadRow> {
  const squad = await findSquadById(squadId);
  if (!squad || !(await isMember(squadId, actor.id))) throw new NotFoundError('You are not in a squad with this id.');
  return squad;
}

/** The squad when `actor` coaches it or is one of its runners (what both sides may read, such as its fee); 404 otherwise. */
export async function squadCoachedOrJoinedBy(actor: Actor, squadId: string): Promise<SquadRow> {
  const squad = await findSquadById(squadId);
  if (!squad || (squad.coach_id !== actor.id && !(await isMember(squadId, actor.id))))
    throw new NotFoundError('There is no squad of yours with this id.');
  return squad;
}
