import { db, type Db, type InvitationRow } from '../../lib/db.ts';

export async function insertInvitation(
  row: { squadId: string; invitedBy: string; email: string; tokenHash: string; expiresAt: Date },
  trx: Db = db,
) {
  const [inserted] = await trx('invitations')
    .insert({
      squad_id: row.squadId,
      invited_by: row.invitedBy,
      email: row.email,
      token_hash: row.tokenHash,
      expires_at: row.expiresAt,
    })
    .returning('*');
  return inserted as InvitationRow;
}

export async function findInvitationByTokenHash(tokenHash: string, trx: Db = db) {
  return trx('invitations').where({ token_hash: tokenHash }).first();
}

export async function listInvitations(squadId: string, trx: Db = db) {
  return trx('invitations').where({ squad_id: squadId }).orderBy('created_at', 'desc');
}

/** Marks an open invitation used, atomically: a second accept finds nothing to update. */
export async function claimInvitation(id: string, userId: string, now: Date, trx: Db = db) {
  const [row] = await trx('invitations')
    .where({ id })
    .whereNull('accepted_at')
    .whereNull('revoked_at')
    .andWhere('expires_at', '>', now)
    .update({ accepted_at: now, accepted_by: userId })
    .returning('*');
  return row as InvitationRow | undefined;
}

export async function revokeInvitation(squadId: string, id: string, now: Date, trx: Db = db): Promise<boolean> {
  return (await trx('invitations').where({ squad_id: squadId, id }).whereNull('accepted_at').update({ revoked_at: now })) > 0;
}

/** Invitations the coach sent since `since` (the daily limit per coach). */
export async function countInvitationsByCoachSince(coachId: string, since: Date, trx: Db = db): Promise<number> {
  const row = await trx('invitations')
    .where({ invited_by: coachId })
    .andWhere('created_at', '>', since)
    .count({ n: '*' })
    .first();
  return Number(row?.n ?? 0);
}

/** Invitations to the address, from any coach, since `since` (the daily limit per address; case does not count). */
export async function countInvitationsToAddressSince(email: string, since: Date, trx: Db = db): Promise<number> {
  const row = await trx('invitations')
    .whereRaw('lower(email) = lower(?)', [email])
    .andWhere('created_at', '>', since)
    .count({ n: '*' })
    .first();
  return Number(row?.n ?? 0);
}
