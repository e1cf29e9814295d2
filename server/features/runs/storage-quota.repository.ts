import type { Knex } from 'knex';
import { db, type Db } from '../../lib/db.ts';

/** Bytes of original files `userId` keeps, and how many files. */
export async function storageUsedBy(userId: string, trx: Db = db): Promise<{ bytes: number; files: number }> {
  const row = (await trx('source_files')
    .where({ user_id: userId })
    .select(trx.raw('coalesce(sum(size_bytes), 0)::bigint as bytes'), trx.raw('count(*)::int as files'))
    .first()) as { bytes: string | number; files: number } | undefined;
  return { bytes: Number(row?.bytes ?? 0), files: row?.files ?? 0 };
}

/**
 * Serialises one user's imports at the quota check (a transaction-scoped advisory lock keyed by
 * the user), so two uploads at once cannot both fit in the space only one of them has.
 */
export async function lockStorageOf(userId: string, trx: Knex.Transaction): Promise<void> {
  await trx.raw("select pg_advisory_xact_lock(hashtextextended('pacewright-storage:' || ?, 0))", [userId]);
}
