import type { Knex } from 'knex';
import { parseOriginalKey } from '../../../shared/runs/orphan-files.ts';
import { db, type Db } from '../../lib/db.ts';

/**
 * One PostgreSQL advisory lock (per database) between storing originals and sweeping orphans:
 * an import holds it shared from just before it stores the file until its transaction ends, the
 * sweeper holds it exclusively while it re-checks and deletes. So the sweeper never deletes a
 * file whose rows are about to be committed, whatever the file's age.
 */
const ORIGINAL_FILES_LOCK = 7_301_926_155;

/** Taken by an import inside its transaction, right before it stores the original. */
export async function holdOriginalFilesSharedLock(trx: Knex.Transaction): Promise<void> {
  await trx.raw('select pg_advisory_xact_lock_shared(?::bigint)', [ORIGINAL_FILES_LOCK]);
}

/** Runs `work` in a transaction holding the lock exclusively (imports wait at their store step meanwhile). */
export async function withOriginalFilesExclusiveLock<T>(work: (trx: Knex.Transaction) => Promise<T>): Promise<T> {
  return db.transaction(async (trx) => {
    await trx.raw('select pg_advisory_xact_lock(?::bigint)', [ORIGINAL_FILES_LOCK]);
    return work(trx);
  });
}

/**
 * Which of `keys` some source_files row names as its storage key. Looked up by (user_id, sha256),
 * which has a unique index, since storage_key itself has none.
 */
export async function findReferencedStorageKeys(keys: readonly string[], trx: Db = db): Promise<Set<string>> {
  const pairs = keys.flatMap((key) => {
    const parts = parseOriginalKey(key);
    return parts ? [[parts.userId, parts.sha256]] : [];
  });
  if (pairs.length === 0) return new Set();
  const rows = await trx('source_files').whereIn(['user_id', 'sha256'], pairs).select('storage_key');
  return new Set(rows.map((r) => r.storage_key));
}
