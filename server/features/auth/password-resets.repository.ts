import { db, type Db, type PasswordResetRow } from '../../lib/db.ts';

/** Reset links made for the user since `since` (the hourly e-mail limit). */
export async function countResetsSince(userId: string, since: Date, trx: Db = db): Promise<number> {
  const [{ recent }] = (await trx('password_resets')
    .where({ user_id: userId })
    .andWhere('created_at', '>', since)
    .count({ recent: '*' })) as [{ recent: string | number }];
  return Number(recent);
}

export async function insertPasswordReset(
  reset: { userId: string; tokenHash: string; createdAt: Date; expiresAt: Date },
  trx: Db = db,
): Promise<void> {
  await trx('password_resets').insert({
    user_id: reset.userId,
    token_hash: reset.tokenHash,
    created_at: reset.createdAt,
    expires_at: reset.expiresAt,
  });
}

export async function findPasswordResetByHash(tokenHash: string, trx: Db = db): Promise<PasswordResetRow | undefined> {
  return trx('password_resets').where({ token_hash: tokenHash }).first();
}

/** Marks one unused link used, atomically: false when another request used it first. */
export async function claimPasswordReset(id: string, now: Date, trx: Db = db): Promise<boolean> {
  return (await trx('password_resets').where({ id }).whereNull('used_at').update({ used_at: now })) > 0;
}

/** Uses up every link of the user still outstanding, so none can undo a new password. */
export async function useUpResetsOf(userId: string, now: Date, trx: Db = db): Promise<void> {
  await trx('password_resets').where({ user_id: userId }).whereNull('used_at').update({ used_at: now });
}
