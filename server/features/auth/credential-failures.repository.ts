import { db, type Db } from '../../lib/db.ts';

// The credential limiter's rows (credential-limiter.ts): one per password check under way or failed.

export async function deleteFailuresBefore(windowStart: Date, trx: Db = db): Promise<void> {
  await trx('credential_failures').where('failed_at', '<', windowStart).delete();
}

/** Writes one failure per key before the password is compared; returns their ids, to strike out on success. */
export async function insertFailures(keys: readonly string[], trx: Db = db): Promise<string[]> {
  const rows = (await trx('credential_failures')
    .insert(keys.map((key) => ({ key })))
    .returning('id')) as Array<{ id: string }>;
  return rows.map((row) => row.id);
}

export async function deleteFailures(ids: readonly string[], trx: Db = db): Promise<void> {
  await trx('credential_failures').whereIn('id', ids).delete();
}

/** Failures per key since `windowStart`, with the oldest one's time (when the key is free again). */
export async function countFailuresSince(
  keys: readonly string[],
  windowStart: Date,
  trx: Db = db,
): Promise<Array<{ key: string; n: number; oldest: Date }>> {
  const rows = (await trx('credential_failures')
    .select('key')
    .count({ n: '*' })
    .min({ oldest: 'failed_at' })
    .whereIn('key', keys)
    .andWhere('failed_at', '>=', windowStart)
    .groupBy('key')) as Array<{ key: string; n: string | number; oldest: Date }>;
  return rows.map((row) => ({ key: row.key, n: Number(row.n), oldest: new Date(row.oldest) }));
}
