import { createHash, randomBytes } from 'node:crypto';
import type { Actor } from '../../../shared/auth/permissions.ts';
import { todayIn } from '../../../shared/runs/local-time.ts';
import { INVITATION_GONE } from '../../../shared/squads/invitation-status.ts';
import { INVITATION_DAYS, type SquadDetail } from '../../../shared/squads/schemas.ts';
import { looksLikeLink, NO_LINKS_IN_SQUAD_NAME } from '../../../shared/squads/link-check.ts';
import type { AppConfig } from '../../config.ts';
import { inTransaction, type InvitationRow } from '../../lib/db.ts';
import { AppError, ForbiddenError, NotFoundError } from '../../lib/errors.ts';
import { logger } from '../../lib/logger.ts';
import { htmlMessage, type Mailer } from '../../lib/mailer.ts';
import { feeOfSquad } from '../fees/index.ts';
import { recordSquadLeave, type NoticeDeps } from '../notices/index.ts';
import { findUserById } from '../users/index.ts';
import { squadCoachedBy } from './runner-access.ts';
import {
  claimInvitation,
  countInvitationsByCoachSince,
  countInvitationsToAddressSince,
  findInvitationByTokenHash,
  insertInvitation,
  listInvitations,
  revokeInvitation,
} from './invitations.repository.ts';
import {
  addMember,
  findSquadById,
  insertSquad,
  listCoachesOfRunner,
  listMembers,
  listSquadsOfUser,
  removeMember,
} from './squads.repository.ts';

const hashToken = (token: string) => createHash('sha256').update(token).digest('hex');

function invitationStatus(row: InvitationRow, now: Date): 'open' | 'accepted' | 'revoked' | 'expired' {
  if (row.accepted_at) return 'accepted';
  if (row.revoked_at) return 'revoked';
  return row.expires_at <= now ? 'expired' : 'open';
}

export async function createSquad(actor: Actor, name: string) {
  const row = await insertSquad(actor.id, name);
  return { id: row.id, name: row.name };
}

/** Squads the actor coaches (with members and invitations) or belongs to (members only). */
export async function listMySquads(actor: Actor, now = new Date()): Promise<SquadDetail[]> {
  const squads = await listSquadsOfUser(actor.id);
  return Promise.all(
    squads.map(async (squad) => {
      const coach = await findUserById(squad.coach_id);
      const members = await listMembers(squad.id);
      const isCoach = squad.coach_id === actor.id;
      const invitations = isCoach ? await listInvitations(squad.id) : [];
      return {
        id: squad.id,
        name: squad.name,
        coach: { id: squad.coach_id, name: coach?.name ?? '' },
        members: members.map((m) => ({
          id: m.id,
          name: m.name,
          email: isCoach ? m.email : '',
          joined_at: m.joined_at.toISOString(),
        })),
        invitations: invitations.map((i) => ({
          id: i.id,
          email: i.email,
          expires_at: i.expires_at.toISOString(),
          status: invitationStatus(i, now),
        })),
      };
    }),
  );
}

const ownSquad = (actor: Actor, squadId: string) => squadCoachedBy(actor, squadId);

/** Invitations one coach may send in 24 hours (issue 13 #5); a squad of 30 invited in a day is already a big club night. */
export const INVITATIONS_PER_COACH_PER_DAY = 30;
/** Invitations one address may receive in 24 hours, from any coach. */
export const INVITATIONS_PER_ADDRESS_PER_DAY = 3;

async function checkInvitationLimits(coachId: string, email: string, now: Date): Promise<void> {
  const since = new Date(now.getTime() - 86_400_000);
  const [byCoach, toAddress] = await Promise.all([
    countInvitationsByCoachSince(coachId, since),
    countInvitationsToAddressSince(email, since),
  ]);
  if (byCoach >= INVITATIONS_PER_COACH_PER_DAY)
    throw new AppError(
      429,
      'too-many-invitations',
      `You have sent ${INVITATIONS_PER_COACH_PER_DAY} invitations in the last 24 hours, the most a coach can send in a day. Please send the rest tomorrow.`,
    );
  if (toAddress >= INVITATIONS_PER_ADDRESS_PER_DAY)
    throw new AppError(
      429,
      'address-invited-enough',
      `${email} has been invited ${INVITATIONS_PER_ADDRESS_PER_DAY} times in the last 24 hours. Please wait a day before inviting it again; the earlier invitation still works.`,
    );
}

/** Sends a signed-in coach's invitation: a random 256-bit token, stored hashed, valid 14 days, usable once. */
export async function inviteRunner(
  actor: Actor,
  squadId: string,
  email: string,
  mailer: Mailer,
  config: AppConfig,
  now = new Date(),
) {
  const squad = await ownSquad(actor, squadId);
  const coach = await findUserById(actor.id);
  // The coach's name and the squad's go into a stranger's inbox: no links in either (issue 13 #5).
  if (looksLikeLink(squad.name))
    throw new AppError(400, 'link-in-squad-name', `${NO_LINKS_IN_SQUAD_NAME} Rename the squad before inviting.`);
  if (coach && looksLikeLink(coach.name))
    throw new AppError(
      400,
      'link-in-coach-name',
      'Your display name looks like a web or e-mail address, and it goes into invitation e-mails. Change it on your profile page, then invite.',
    );
  await checkInvitationLimits(actor.id, email, now);
  const token = 'inv_' + randomBytes(32).toString('base64url');
  const expiresAt = new Date(now.getTime() + INVITATION_DAYS * 86_400_000);
  const link = `${config.publicUrl}/invite/${token}`;
  const invitation = await inTransaction(async (trx) => {
    const row = await insertInvitation({ squadId, invitedBy: actor.id, email, tokenHash: hashToken(token), expiresAt }, trx);
    // Sent inside the transaction: if the mail cannot go out, no invitation is left behind.
    const intro = `${coach?.name ?? 'Your coach'} invites you to join the squad "${squad.name}" on Pacewright, a training log for runners and their coaches.`;
    const how = `Your coach will see your runs, session plans and weeks, and write notes on them. You can leave the squad at any time. The link works once and expires on ${expiresAt.toISOString().slice(0, 10)}.`;
    await mailer.send({
      to: email,
      subject: `${coach?.name ?? 'A coach'} invites you to ${squad.name} on Pacewright`,
      text: `${intro}\n\n${how}\n\nAccept the invitation: ${link}\n`,
      html: htmlMessage(`Join ${squad.name}`, [intro, how], { href: link, label: 'Accept the invitation' }),
    });
    return row;
  });
  return { id: invitation.id, email: invitation.email, expires_at: invitation.expires_at.toISOString() };
}

async function invitationByToken(token: string) {
  const row = /^inv_[A-Za-z0-9_-]{43}$/.test(token) ? await findInvitationByTokenHash(hashToken(token)) : undefined;
  if (!row)
    throw new AppError(400, 'invalid-invitation', 'This invitation link is not valid. Check that you copied the whole link.');
  return row;
}

/**
 * True when `token` is an open invitation to `email`: whoever holds it read the invitation e-mail,
 * which proves the address, so a sign-up to that address needs no second e-mail (issue 13 #7).
 */
export async function invitationVouchesFor(token: string, email: string, now = new Date()): Promise<boolean> {
  if (!/^inv_[A-Za-z0-9_-]{43}$/.test(token)) return false;
  const row = await findInvitationByTokenHash(hashToken(token));
  return !!row && invitationStatus(row, now) === 'open' && row.email.toLowerCase() === email.toLowerCase();
}

/** What the invite page shows before signing in or up. */
export async function previewInvitation(token: string, now = new Date()) {
  const row = await invitationByToken(token);
  const squad = (await findSquadById(row.squad_id))!;
  const coach = await findUserById(squad.coach_id);
  return {
    squad: { id: squad.id, name: squad.name },
    coach: { name: coach?.name ?? '' },
    email: row.email,
    status: invitationStatus(row, now),
    // A paid squad says its fee before anyone accepts (issue 20).
    fee: await feeOfSquad(squad.id),
  };
}

export async function acceptInvitation(actor: Actor & { email: string }, token: string, now = new Date()) {
  const row = await invitationByToken(token);
  const status = invitationStatus(row, now);
  if (status !== 'open') throw new AppError(410, `invitation-${status}`, INVITATION_GONE[status]);
  if (actor.role !== 'runner')
    throw new ForbiddenError('Invitations are for runners. Sign in with your runner account to accept it.');
  // Bound to the invited address (issue 13 #11): whoever else holds the link cannot join with it.
  if (actor.email.toLowerCase() !== row.email.toLowerCase())
    throw new ForbiddenError(
      `This invitation was sent to ${row.email}, and you are signed in as ${actor.email}. Sign in with the invited address, or ask your coach to invite ${actor.email} instead.`,
      'invitation-other-address',
    );
  const squad = (await findSquadById(row.squad_id))!;
  await inTransaction(async (trx) => {
    const claimed = await claimInvitation(row.id, actor.id, now, trx);
    if (!claimed) throw new AppError(410, 'invitation-accepted', INVITATION_GONE.accepted);
    await addMember(squad.id, actor.id, trx);
  });
  return { id: squad.id, name: squad.name };
}

export async function withdrawInvitation(actor: Actor, squadId: string, invitationId: string, now = new Date()) {
  await ownSquad(actor, squadId);
  if (!(await revokeInvitation(squadId, invitationId, now))) throw new NotFoundError('There is no open invitation with this id.');
}

/** A coach removes a runner, or a runner leaves (runnerId = themself); a runner leaving is told to the coach. */
export async function removeFromSquad(actor: Actor, squadId: string, runnerId: string, notices: NoticeDeps, now = new Date()) {
  const squad = await findSquadById(squadId);
  const allowed = squad && (squad.coach_id === actor.id || runnerId === actor.id);
  if (!allowed || !(await removeMember(squadId, runnerId))) throw new NotFoundError('This runner is not in that squad.');
  if (runnerId !== actor.id || runnerId === squad.coach_id) return;
  const runner = await findUserById(runnerId);
  const leftOn = todayIn(runner?.time_zone ?? 'UTC', now.getTime());
  await recordSquadLeave(squad, { id: runnerId, name: runner?.name ?? 'A runner' }, leftOn, notices).catch((err: unknown) =>
    logger.error({ err, squad: squad.id }, 'recording a squad-leave notice failed'),
  );
}

export async function coachesOf(actor: Actor) {
  return (await listCoachesOfRunner(actor.id)).map((c) => ({
    squad: { id: c.squad_id, name: c.squad_name },
    coach: { id: c.coach_id, name: c.coach_name, email: c.coach_email },
  }));
}
