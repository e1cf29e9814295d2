import { db, type Db, type PendingSignupRow } from '../../lib/db.ts';

/** Sign-up links and "someone tried" notices older than `before`: kept only for counting, then dropped. */
export async function deleteSignUpMailsBefore(before: Date, trx: Db = db): Promise<void> {
  await trx('pending_signups').where('created_at', '<', before).delete();
  await trx('sign_up_notices').where('created_at', '<', before).delete();
}

/** E-mails the sign-up form sent to `email` since `since`: links and notices together. */
export async function countSignUpMailsSince(email: string, since: Date, trx: Db = db): Promise<number> {
  const counts = await Promise.all(
    (['pending_signups', 'sign_up_notices'] as const).map((table) =>
      trx(table).where({ email }).andWhere('created_at', '>', since).count({ n: '*' }).first(),
    ),
  );
  return counts.reduce((sum, c) => sum + Number(c?.n ?? 0), 0);
}

export async function insertSignUpNotice(email: string, createdAt: Date, trx: Db = db): Promise<void> {
  await trx('sign_up_notices').insert({ email, created_at: createdAt });
}

export async function insertPendingSignUp(row: Omit<PendingSignupRow, 'used_at'>, trx: Db = db): Promise<void> {
  await trx('pending_signups').insert(row);
}

export async function findPendingSignUpByHash(tokenHash: string, trx: Db = db): Promise<PendingSignupRow | undefined> {
  return trx('pending_signups').where({ token_hash: tokenHash }).first();
}

/** Marks the link used, atomically: false when another request used it first. */
export async function claimPendingSignUp(id: string, now: Date, trx: Db = db): Promise<boolean> {
  return (await trx('pending_signups').where({ id }).whereNull('used_at').update({ used_at: now })) > 0;
}
